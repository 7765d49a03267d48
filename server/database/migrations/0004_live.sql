CREATE TABLE "live_dirty" (
	"event_id" integer NOT NULL,
	"ring_number" integer NOT NULL,
	"marked_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "live_dirty_event_id_ring_number_pk" PRIMARY KEY("event_id","ring_number")
);
--> statement-breakpoint
CREATE TABLE "live_events" (
	"event_id" integer NOT NULL,
	"ring_number" integer NOT NULL,
	"seq" integer NOT NULL,
	"kind" text NOT NULL,
	"payload" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "live_events_event_id_ring_number_seq_pk" PRIMARY KEY("event_id","ring_number","seq")
);
--> statement-breakpoint
CREATE TABLE "ring_states" (
	"event_id" integer NOT NULL,
	"ring_number" integer NOT NULL,
	"seq" integer DEFAULT 0 NOT NULL,
	"current_match_id" integer,
	"board" text DEFAULT 'bout' NOT NULL,
	"board_mode" text DEFAULT 'auto' NOT NULL,
	"overlay_token" text DEFAULT replace(gen_random_uuid()::text || gen_random_uuid()::text, '-', '') NOT NULL,
	"token_rotated_at" timestamp with time zone,
	"version" integer DEFAULT 0 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "ring_states_event_id_ring_number_pk" PRIMARY KEY("event_id","ring_number"),
	CONSTRAINT "ring_states_overlay_token_unique" UNIQUE("overlay_token"),
	CONSTRAINT "ring_states_ring_range" CHECK ("ring_states"."ring_number" between 1 and 8),
	CONSTRAINT "ring_states_board" CHECK ("ring_states"."board" in ('bout', 'up-next', 'pool', 'bracket', 'winner', 'none')),
	CONSTRAINT "ring_states_board_mode" CHECK ("ring_states"."board_mode" in ('auto', 'manual'))
);
--> statement-breakpoint
ALTER TABLE "matches" ADD COLUMN "clock_elapsed_ms" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "matches" ADD COLUMN "clock_running_since" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "live_dirty" ADD CONSTRAINT "live_dirty_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "live_events" ADD CONSTRAINT "live_events_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ring_states" ADD CONSTRAINT "ring_states_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ring_states" ADD CONSTRAINT "ring_states_current_match_id_matches_id_fk" FOREIGN KEY ("current_match_id") REFERENCES "public"."matches"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "live_events_kind_idx" ON "live_events" USING btree ("event_id","ring_number","kind","seq");--> statement-breakpoint
ALTER TABLE "matches" ADD CONSTRAINT "matches_clock_positive" CHECK ("matches"."clock_elapsed_ms" >= 0);