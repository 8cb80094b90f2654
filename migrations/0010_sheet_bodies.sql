-- The signed-in sheet's body per channel part (the JSON its client loads, gzipped), written with each new
-- evaluation and, for the ones stored before, on their first read; sent as stored. Derived data: never updated.
CREATE TABLE "evaluation_sheet_bodies" (
	"evaluation_id" uuid NOT NULL,
	"part" integer NOT NULL,
	"gzip" bytea NOT NULL,
	CONSTRAINT "evaluation_sheet_bodies_evaluation_id_part_pk" PRIMARY KEY("evaluation_id","part")
);
--> statement-breakpoint
ALTER TABLE "evaluation_sheet_bodies" ADD CONSTRAINT "evaluation_sheet_bodies_evaluation_id_evaluations_id_fk" FOREIGN KEY ("evaluation_id") REFERENCES "public"."evaluations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE TRIGGER evaluation_sheet_bodies_no_update
  BEFORE UPDATE ON "evaluation_sheet_bodies"
  FOR EACH ROW EXECUTE FUNCTION stored_record_immutable();
