import "server-only";
import { deleteAbandonedCapture, listAbandonedUploads } from "@/db/queries/captures";
import { deleteObject } from "@/lib/storage/s3";
import { incomingKey } from "./confirm-upload";

/** How long a registered capture may wait for its upload to be confirmed. */
export const abandonedUploadAgeMs = 24 * 3_600_000;

/**
 * Removes captures whose upload never completed within 24 h: the incoming object, any partial
 * original, and the row (with an audit event). Run hourly by the queue's schedule. Returns how many went.
 */
export async function removeAbandonedUploads({ now = new Date() }: { now?: Date } = {}): Promise<number> {
  const before = new Date(now.getTime() - abandonedUploadAgeMs);
  let removed = 0;
  for (const capture of await listAbandonedUploads({ before })) {
    await deleteObject(incomingKey(capture.id)).catch(() => undefined);
    await deleteObject(capture.s3Key).catch(() => undefined);
    if (await deleteAbandonedCapture({ id: capture.id, before })) removed += 1;
  }
  return removed;
}
