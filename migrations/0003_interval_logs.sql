CREATE TYPE "public"."capture_kind" AS ENUM('waveform', 'interval-log');--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "interval_mapping" jsonb;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "kind" "capture_kind" DEFAULT 'waveform' NOT NULL;--> statement-breakpoint
ALTER TABLE "analyses" ADD COLUMN "trends" jsonb;