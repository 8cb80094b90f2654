ALTER TABLE "captures" ADD COLUMN "setup_by" text;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "sha256" text;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "approved_evaluation_id" uuid;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "withdrawn_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "analyses" ADD COLUMN "setup" jsonb;--> statement-breakpoint
ALTER TABLE "analyses" ADD COLUMN "setup_by" text;--> statement-breakpoint
ALTER TABLE "analyses" ADD COLUMN "file_sha256" text;--> statement-breakpoint
ALTER TABLE "captures" ADD CONSTRAINT "captures_setup_by_users_id_fk" FOREIGN KEY ("setup_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_setup_by_users_id_fk" FOREIGN KEY ("setup_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;