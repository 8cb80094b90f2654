import "server-only";
import { NextResponse } from "next/server";
import type { z } from "zod";
import { toCaptureView } from "@/db/queries/capture-view";
import { getCaptureById } from "@/db/queries/captures";
import type { Capture } from "@/db/schema";
import type { Reader } from "@/lib/auth/permissions";
import { authoriseCaptureEdit } from "@/lib/auth/session";
import { captureParamsSchema } from "./params";
import { readJson, withAuth } from "./with-auth";

/**
 * The PUT handler of a capture's set-up route (a waveform record's or an interval log's): the
 * capture is authorised first (404 when this user cannot see it, 403 when its set-up is no longer
 * theirs to change), then the body is parsed with `schema` and saved; answers `{ capture }` in the shape of
 * `GET /api/captures/:id` (no storage key or set-up).
 *
 * @example export const PUT = captureSetupRoute(captureSetupSchema, saveCaptureSetup);
 */
export function captureSetupRoute<Setup>(
  schema: z.ZodType<Setup>,
  save: (input: { id: string; setup: Setup; actorId: string; reader: Reader }) => Promise<Capture>,
) {
  return withAuth<{ id: string }>(
    async ({ req, params, user }) => {
      const { id } = captureParamsSchema.parse(params);
      authoriseCaptureEdit(user, await getCaptureById({ id, reader: user }));
      const setup = schema.parse(await readJson(req));
      return NextResponse.json({ capture: toCaptureView(await save({ id, setup, actorId: user.id, reader: user })) });
    },
    { permission: "captures:upload" },
  );
}
