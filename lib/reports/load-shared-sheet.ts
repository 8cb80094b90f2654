import "server-only";
import { z } from "zod";
import { findShareLink } from "@/db/queries/captures";
import { hashToken } from "@/db/queries/users";
import { loadChartJson, loadSheet, loadSheetPage } from "@/lib/captures/load-sheet";
import { systemReader } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";

// Share tokens are 20 random bytes in lower-case base32 (32 characters).
const tokenSchema = z.string().regex(/^[a-z2-7]{16,64}$/);

const gone = () => new AppError("not_found", "This link is no longer valid.");

/** The capture id a share token opens; not_found when unknown, revoked or expired. */
async function sharedCaptureId(token: string): Promise<string> {
  return (await sharedLink(token)).captureId;
}

async function sharedLink(token: string): Promise<{ captureId: string; expiresAt: Date }> {
  if (!tokenSchema.safeParse(token).success) throw gone();
  const link = await findShareLink({ tokenHash: hashToken(token) });
  // An approved result stays readable while a newer analysis is queued, running or failed.
  if (!link || (link.capture.status !== "done" && !link.capture.approvedEvaluationId)) throw gone();
  return { captureId: link.capture.id, expiresAt: link.expiresAt };
}

/**
 * The sheet a share link shows: the approved evaluation while one exists, else the newest. The token itself is the
 * authorisation, so the capture is read with a reviewer's visibility (not a viewer's filter).
 */
export async function loadSharedSheet({ token }: { token: string }) {
  const { captureId, expiresAt } = await sharedLink(token);
  return { ...(await loadSheet({ captureId, reader: systemReader, approvedOnly: true })), shareExpiresAt: expiresAt };
}

/** The shared sheet as its page shows it (lib/captures/load-sheet.ts, loadSheetPage): one channel, named or the worst. */
export async function loadSharedSheetPage({ token, channel }: { token: string; channel?: string }) {
  const { captureId, expiresAt } = await sharedLink(token);
  return { ...(await loadSheetPage({ captureId, reader: systemReader, approvedOnly: true, channel })), shareExpiresAt: expiresAt };
}

/** Chart data for a share link, with the same check as the sheet. */
export async function loadSharedChartData({ token }: { token: string }) {
  const captureId = await sharedCaptureId(token);
  return loadChartJson({ captureId, reader: systemReader });
}
