import "server-only";
import { getCaptureById } from "@/db/queries/captures";
import { authoriseCaptureEdit } from "@/lib/auth/session";
import type { Reader } from "@/lib/auth/permissions";
import { captureParamsSchema } from "./params";

/**
 * The capture id of a set-up route's path, once this user may edit that capture's set-up
 * (404 when the capture is not visible to them, 403 when it is no longer editable by them).
 */
export async function editableCaptureId(params: unknown, user: Reader): Promise<string> {
  const { id } = captureParamsSchema.parse(params);
  authoriseCaptureEdit(user, await getCaptureById({ id, reader: user }));
  return id;
}
