import { pgEnum } from "drizzle-orm/pg-core";

export const roleEnum = pgEnum("role", ["admin", "engineer", "technician", "viewer"]);
export const captureStatusEnum = pgEnum("capture_status", ["uploading", "uploaded", "queued", "running", "done", "failed"]);
export const reviewStateEnum = pgEnum("review_state", ["draft", "in_review", "approved", "sent_back"]);
export const reviewActionEnum = pgEnum("review_action", ["submitted", "approved", "sent_back", "comment"]);
export const captureKindEnum = pgEnum("capture_kind", ["waveform", "interval-log"]);
