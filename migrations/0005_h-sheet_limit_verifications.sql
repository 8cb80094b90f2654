CREATE TABLE "limit_set_verifications" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"edition" text NOT NULL,
	"checked" text NOT NULL,
	"verified_by_id" text,
	"verified_by_name" text NOT NULL,
	"verified_on" date NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "limit_set_verifications" ADD CONSTRAINT "limit_set_verifications_revision_id_limit_set_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."limit_set_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "limit_set_verifications" ADD CONSTRAINT "limit_set_verifications_verified_by_id_users_id_fk" FOREIGN KEY ("verified_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "limit_set_verifications_revision_idx" ON "limit_set_verifications" USING btree ("revision_id");