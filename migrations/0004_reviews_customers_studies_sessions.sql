CREATE TABLE "sign_in_throttle" (
	"key" text PRIMARY KEY NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"window_start" timestamp with time zone DEFAULT now() NOT NULL,
	"next_attempt_at" timestamp with time zone DEFAULT now() NOT NULL,
	"claim" text
);
--> statement-breakpoint
CREATE TABLE "customer_members" (
	"customer_id" uuid NOT NULL,
	"user_id" text NOT NULL,
	CONSTRAINT "customer_members_customer_id_user_id_pk" PRIMARY KEY("customer_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "customers" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "customers_name_unique" UNIQUE("name")
);
--> statement-breakpoint
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
CREATE TABLE "mitigation_studies" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"capture_id" uuid NOT NULL,
	"analysis_id" uuid NOT NULL,
	"evaluation_id" uuid,
	"title" text NOT NULL,
	"model_version" text NOT NULL,
	"inputs" jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"predicted_verdict" text NOT NULL,
	"include_in_report" boolean DEFAULT false NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "sessions" ADD COLUMN "created_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "customer_id" uuid;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "setup_by" text;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "sha256" text;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "approved_evaluation_id" uuid;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "withdrawn_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "analyses" ADD COLUMN "setup" jsonb;--> statement-breakpoint
ALTER TABLE "analyses" ADD COLUMN "setup_by" text;--> statement-breakpoint
ALTER TABLE "analyses" ADD COLUMN "file_sha256" text;--> statement-breakpoint
ALTER TABLE "evaluations" ADD COLUMN "charts" jsonb;--> statement-breakpoint
ALTER TABLE "customer_members" ADD CONSTRAINT "customer_members_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "customer_members" ADD CONSTRAINT "customer_members_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "limit_set_verifications" ADD CONSTRAINT "limit_set_verifications_revision_id_limit_set_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."limit_set_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "limit_set_verifications" ADD CONSTRAINT "limit_set_verifications_verified_by_id_users_id_fk" FOREIGN KEY ("verified_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mitigation_studies" ADD CONSTRAINT "mitigation_studies_capture_id_captures_id_fk" FOREIGN KEY ("capture_id") REFERENCES "public"."captures"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mitigation_studies" ADD CONSTRAINT "mitigation_studies_analysis_id_analyses_id_fk" FOREIGN KEY ("analysis_id") REFERENCES "public"."analyses"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mitigation_studies" ADD CONSTRAINT "mitigation_studies_evaluation_id_evaluations_id_fk" FOREIGN KEY ("evaluation_id") REFERENCES "public"."evaluations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mitigation_studies" ADD CONSTRAINT "mitigation_studies_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "limit_set_verifications_revision_idx" ON "limit_set_verifications" USING btree ("revision_id");--> statement-breakpoint
CREATE INDEX "mitigation_studies_capture_idx" ON "mitigation_studies" USING btree ("capture_id");--> statement-breakpoint
ALTER TABLE "sites" ADD CONSTRAINT "sites_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "captures" ADD CONSTRAINT "captures_setup_by_users_id_fk" FOREIGN KEY ("setup_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_setup_by_users_id_fk" FOREIGN KEY ("setup_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;