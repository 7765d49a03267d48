CREATE TABLE "card_batches" (
	"id" serial PRIMARY KEY NOT NULL,
	"club_id" integer NOT NULL,
	"tournament_id" integer NOT NULL,
	"sizes" text[] NOT NULL,
	"status" text DEFAULT 'queued' NOT NULL,
	"total" integer DEFAULT 0 NOT NULL,
	"done" integer DEFAULT 0 NOT NULL,
	"reused" integer DEFAULT 0 NOT NULL,
	"zip_key" text,
	"zip_bytes" integer,
	"error" text,
	"worker" text,
	"requested_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	CONSTRAINT "card_batches_status" CHECK ("card_batches"."status" in ('queued', 'running', 'done', 'failed')),
	CONSTRAINT "card_batches_progress" CHECK ("card_batches"."done" >= 0 and "card_batches"."done" <= "card_batches"."total" and "card_batches"."reused" <= "card_batches"."done"),
	CONSTRAINT "card_batches_done_has_zip" CHECK ("card_batches"."status" <> 'done' or "card_batches"."zip_key" is not null)
);
--> statement-breakpoint
ALTER TABLE "card_batches" ADD CONSTRAINT "card_batches_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "card_batches" ADD CONSTRAINT "card_batches_tournament_id_tournaments_id_fk" FOREIGN KEY ("tournament_id") REFERENCES "public"."tournaments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "card_batches" ADD CONSTRAINT "card_batches_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "card_batches_club_idx" ON "card_batches" USING btree ("club_id","created_at");