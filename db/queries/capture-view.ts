import { captures, type Capture } from "@/db/schema";

/**
 * The columns of a capture a JSON answer carries: its identity, state and progress. Never its storage
 * key, file hash, set-up (mapping, context) or who set it up and uploaded it — those stay on the server.
 */
export const captureViewColumns = {
  id: captures.id,
  siteId: captures.siteId,
  title: captures.title,
  kind: captures.kind,
  status: captures.status,
  progressPercent: captures.progressPercent,
  failureReason: captures.failureReason,
  reviewState: captures.reviewState,
  approvedEvaluationId: captures.approvedEvaluationId,
  limitSetKey: captures.limitSetKey,
  originalFilename: captures.originalFilename,
  sizeBytes: captures.sizeBytes,
  capturedAt: captures.capturedAt,
  createdAt: captures.createdAt,
  updatedAt: captures.updatedAt,
};

export type CaptureView = Pick<Capture, keyof typeof captureViewColumns>;

const viewKeys = Object.keys(captureViewColumns) as Array<keyof typeof captureViewColumns>;

/** A stored capture as a JSON answer carries it (the same shape as `GET /api/captures/:id`). */
export function toCaptureView(capture: Capture): CaptureView {
  return Object.fromEntries(viewKeys.map((key) => [key, capture[key]])) as CaptureView;
}
