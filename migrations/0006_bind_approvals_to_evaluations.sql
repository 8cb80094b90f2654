-- Captures approved before approvals were bound to an evaluation: bind each to the evaluation its
-- last "approved" review event recorded. Those without one lose the approved state (nothing to bind).
UPDATE "captures" c SET "approved_evaluation_id" = (
  SELECT r."evaluation_id" FROM "review_events" r
  WHERE r."capture_id" = c."id" AND r."action" = 'approved' AND r."evaluation_id" IS NOT NULL
  ORDER BY r."created_at" DESC LIMIT 1
) WHERE c."review_state" = 'approved';--> statement-breakpoint
UPDATE "captures" SET "review_state" = 'in_review' WHERE "review_state" = 'approved' AND "approved_evaluation_id" IS NULL;--> statement-breakpoint
-- An approval made before a newer evaluation was stored now waits for review of that newer result.
UPDATE "captures" c SET "review_state" = 'in_review' WHERE c."review_state" = 'approved' AND c."approved_evaluation_id" IS DISTINCT FROM (
  SELECT e."id" FROM "evaluations" e WHERE e."capture_id" = c."id" ORDER BY e."created_at" DESC LIMIT 1
);
