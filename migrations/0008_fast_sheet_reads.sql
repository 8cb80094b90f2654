-- The sheet page reads the head of a result and one channel (evaluation_sheet_parts), written with each new
-- evaluation and, for the ones stored before, on their first view. Parts are derived data: never updated.
CREATE TABLE "evaluation_sheet_parts" (
	"evaluation_id" uuid NOT NULL,
	"part" integer NOT NULL,
	"channel" text,
	"data" json NOT NULL,
	CONSTRAINT "evaluation_sheet_parts_evaluation_id_part_pk" PRIMARY KEY("evaluation_id","part")
);
--> statement-breakpoint
CREATE TRIGGER evaluation_sheet_parts_no_update
  BEFORE UPDATE ON "evaluation_sheet_parts"
  FOR EACH ROW EXECUTE FUNCTION stored_record_immutable();
--> statement-breakpoint
-- A sheet reads an evaluation's result and chart data whole and never queries inside them: as `json` they
-- are returned as stored, without the jsonb-to-text conversion (~35 ms for a three-phase result).
-- ALTER COLUMN TYPE rewrites the table without firing the row triggers that keep evaluations immutable.
ALTER TABLE "evaluations" ALTER COLUMN "result" SET DATA TYPE json;--> statement-breakpoint
ALTER TABLE "evaluations" ALTER COLUMN "charts" SET DATA TYPE json;--> statement-breakpoint
-- The analysis without its per-order and per-window arrays (lib/reports/analysis-summary.ts), written with
-- each new analysis; filled here for the stored ones with the same projection.
ALTER TABLE "analyses" ADD COLUMN "summary" json;--> statement-breakpoint
UPDATE "analyses" SET "summary" = jsonb_build_object(
  'fundamentalHz', "result"->'fundamentalHz',
  'sampleIntervalS', "result"->'sampleIntervalS',
  'power', "result"->'power',
  'sequence', coalesce((select jsonb_agg(s.v - 'orders' order by s.i) from jsonb_array_elements(coalesce("result"->'sequence', '[]'::jsonb)) with ordinality as s(v, i)), '[]'::jsonb),
  'channels', coalesce((select jsonb_agg(c.v - 'harmonics' - 'series' - 'harmonicSeries' - 'groups' order by c.i) from jsonb_array_elements("result"->'channels') with ordinality as c(v, i)), '[]'::jsonb)
)::json;--> statement-breakpoint
ALTER TABLE "evaluation_sheet_parts" ADD CONSTRAINT "evaluation_sheet_parts_evaluation_id_evaluations_id_fk" FOREIGN KEY ("evaluation_id") REFERENCES "public"."evaluations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
-- Indexes for what the per-request filters look up: a viewer's customers, their sites, a site's captures,
-- and a user's sessions.
CREATE INDEX "sessions_user_idx" ON "sessions" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "customer_members_user_idx" ON "customer_members" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "sites_customer_idx" ON "sites" USING btree ("customer_id");--> statement-breakpoint
CREATE INDEX "captures_site_idx" ON "captures" USING btree ("site_id");
