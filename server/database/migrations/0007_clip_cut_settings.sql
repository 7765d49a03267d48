ALTER TABLE "clips" ADD COLUMN "requested_mode" text DEFAULT 'auto' NOT NULL;--> statement-breakpoint
ALTER TABLE "clips" ADD COLUMN "tolerance_ms" integer DEFAULT 500 NOT NULL;--> statement-breakpoint
ALTER TABLE "clips" ADD COLUMN "cut_start_ms" integer;--> statement-breakpoint
ALTER TABLE "clips" ADD CONSTRAINT "clips_requested_mode" CHECK ("clips"."requested_mode" in ('auto', 'copy', 'exact'));--> statement-breakpoint
ALTER TABLE "clips" ADD CONSTRAINT "clips_tolerance" CHECK ("clips"."tolerance_ms" >= 0);