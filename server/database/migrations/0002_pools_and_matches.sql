CREATE TYPE "public"."bracket_format" AS ENUM('bracket', 'round-robin');--> statement-breakpoint
CREATE TYPE "public"."match_stage" AS ENUM('pool', 'final');--> statement-breakpoint
CREATE TYPE "public"."match_status" AS ENUM('scheduled', 'under-way', 'finished', 'forfeit');--> statement-breakpoint
CREATE TABLE "brackets" (
	"tournament_id" integer PRIMARY KEY NOT NULL,
	"format" "bracket_format" DEFAULT 'bracket' NOT NULL,
	"state" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "match_entries" (
	"id" text NOT NULL,
	"match_id" integer NOT NULL,
	"seq" integer NOT NULL,
	"payload" jsonb NOT NULL,
	"recorded_by" integer,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "match_entries_match_id_id_pk" PRIMARY KEY("match_id","id"),
	CONSTRAINT "match_entries_seq_unique" UNIQUE("match_id","seq"),
	CONSTRAINT "match_entries_seq_positive" CHECK ("match_entries"."seq" >= 1)
);
--> statement-breakpoint
CREATE TABLE "matches" (
	"id" serial PRIMARY KEY NOT NULL,
	"tournament_id" integer NOT NULL,
	"pool_id" integer,
	"stage" "match_stage" NOT NULL,
	"bracket_match_key" text,
	"order_in_pool" integer,
	"side_a_entry" integer,
	"side_b_entry" integer,
	"status" "match_status" DEFAULT 'scheduled' NOT NULL,
	"version" integer DEFAULT 0 NOT NULL,
	"forfeited_by" text,
	"forfeit_reason" text,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "matches_stage_shape" CHECK (("matches"."stage" = 'pool' and "matches"."pool_id" is not null and "matches"."order_in_pool" is not null and "matches"."bracket_match_key" is null)
    or ("matches"."stage" = 'final' and "matches"."pool_id" is null and "matches"."bracket_match_key" is not null)),
	CONSTRAINT "matches_version_positive" CHECK ("matches"."version" >= 0),
	CONSTRAINT "matches_forfeit_side" CHECK (("matches"."status" = 'forfeit') = ("matches"."forfeited_by" is not null)),
	CONSTRAINT "matches_forfeited_by_side" CHECK ("matches"."forfeited_by" is null or "matches"."forfeited_by" in ('a', 'b')),
	CONSTRAINT "matches_two_fighters" CHECK ("matches"."side_a_entry" is null or "matches"."side_b_entry" is null or "matches"."side_a_entry" <> "matches"."side_b_entry")
);
--> statement-breakpoint
CREATE TABLE "pool_members" (
	"pool_id" integer NOT NULL,
	"entry_id" integer NOT NULL,
	"position" integer NOT NULL,
	CONSTRAINT "pool_members_pool_id_entry_id_pk" PRIMARY KEY("pool_id","entry_id"),
	CONSTRAINT "pool_members_position_unique" UNIQUE("pool_id","position"),
	CONSTRAINT "pool_members_position_positive" CHECK ("pool_members"."position" >= 1)
);
--> statement-breakpoint
CREATE TABLE "pools" (
	"id" serial PRIMARY KEY NOT NULL,
	"tournament_id" integer NOT NULL,
	"number" integer NOT NULL,
	"ring_number" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "pools_number_positive" CHECK ("pools"."number" >= 1),
	CONSTRAINT "pools_ring_range" CHECK ("pools"."ring_number" between 1 and 8)
);
--> statement-breakpoint
CREATE TABLE "tournament_lots" (
	"id" serial PRIMARY KEY NOT NULL,
	"tournament_id" integer NOT NULL,
	"scope" text NOT NULL,
	"seed" text NOT NULL,
	"fighters" text NOT NULL,
	"order" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "brackets" ADD CONSTRAINT "brackets_tournament_id_tournaments_id_fk" FOREIGN KEY ("tournament_id") REFERENCES "public"."tournaments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "match_entries" ADD CONSTRAINT "match_entries_match_id_matches_id_fk" FOREIGN KEY ("match_id") REFERENCES "public"."matches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "match_entries" ADD CONSTRAINT "match_entries_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "matches" ADD CONSTRAINT "matches_tournament_id_tournaments_id_fk" FOREIGN KEY ("tournament_id") REFERENCES "public"."tournaments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "matches" ADD CONSTRAINT "matches_pool_id_pools_id_fk" FOREIGN KEY ("pool_id") REFERENCES "public"."pools"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "matches" ADD CONSTRAINT "matches_side_a_entry_entries_id_fk" FOREIGN KEY ("side_a_entry") REFERENCES "public"."entries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "matches" ADD CONSTRAINT "matches_side_b_entry_entries_id_fk" FOREIGN KEY ("side_b_entry") REFERENCES "public"."entries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pool_members" ADD CONSTRAINT "pool_members_pool_id_pools_id_fk" FOREIGN KEY ("pool_id") REFERENCES "public"."pools"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pool_members" ADD CONSTRAINT "pool_members_entry_id_entries_id_fk" FOREIGN KEY ("entry_id") REFERENCES "public"."entries"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pools" ADD CONSTRAINT "pools_tournament_id_tournaments_id_fk" FOREIGN KEY ("tournament_id") REFERENCES "public"."tournaments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tournament_lots" ADD CONSTRAINT "tournament_lots_tournament_id_tournaments_id_fk" FOREIGN KEY ("tournament_id") REFERENCES "public"."tournaments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "matches_tournament_idx" ON "matches" USING btree ("tournament_id","stage");--> statement-breakpoint
CREATE UNIQUE INDEX "matches_pool_order_unique" ON "matches" USING btree ("pool_id","order_in_pool");--> statement-breakpoint
CREATE UNIQUE INDEX "matches_bracket_key_unique" ON "matches" USING btree ("tournament_id","bracket_match_key");--> statement-breakpoint
CREATE UNIQUE INDEX "pool_members_entry_unique" ON "pool_members" USING btree ("entry_id");--> statement-breakpoint
CREATE UNIQUE INDEX "pools_tournament_number_unique" ON "pools" USING btree ("tournament_id","number");--> statement-breakpoint
CREATE UNIQUE INDEX "tournament_lots_draw_unique" ON "tournament_lots" USING btree ("tournament_id","scope","fighters");