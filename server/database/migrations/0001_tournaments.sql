CREATE TYPE "public"."entry_status" AS ENUM('entered', 'checked-in', 'withdrawn');--> statement-breakpoint
CREATE TYPE "public"."tournament_phase" AS ENUM('entries', 'pools', 'finals', 'done');--> statement-breakpoint
CREATE TABLE "entries" (
	"id" serial PRIMARY KEY NOT NULL,
	"tournament_id" integer NOT NULL,
	"fighter_id" integer NOT NULL,
	"seed" integer,
	"status" "entry_status" DEFAULT 'entered' NOT NULL,
	"checked_in_at" timestamp with time zone,
	"checked_in_by" integer,
	"kit_checked" boolean DEFAULT false NOT NULL,
	"weapon_checked" boolean DEFAULT false NOT NULL,
	"withdrawn_at" timestamp with time zone,
	"withdrawal_reason" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "entries_seed_positive" CHECK ("entries"."seed" is null or "entries"."seed" >= 1),
	CONSTRAINT "entries_checked_in_safely" CHECK ("entries"."status" <> 'checked-in' or ("entries"."kit_checked" and "entries"."weapon_checked" and "entries"."checked_in_at" is not null)),
	CONSTRAINT "entries_withdrawn_has_reason" CHECK ("entries"."status" <> 'withdrawn' or ("entries"."withdrawn_at" is not null and "entries"."withdrawal_reason" is not null))
);
--> statement-breakpoint
CREATE TABLE "events" (
	"id" serial PRIMARY KEY NOT NULL,
	"club_id" integer NOT NULL,
	"name" text NOT NULL,
	"slug" text NOT NULL,
	"starts_on" date NOT NULL,
	"ends_on" date NOT NULL,
	"venue" text DEFAULT '' NOT NULL,
	"rings" integer DEFAULT 1 NOT NULL,
	"published" boolean DEFAULT false NOT NULL,
	"published_at" timestamp with time zone,
	"emergency_number" text DEFAULT '' NOT NULL,
	"first_aid_point" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "events_rings_range" CHECK ("events"."rings" between 1 and 8),
	CONSTRAINT "events_dates_order" CHECK ("events"."ends_on" >= "events"."starts_on")
);
--> statement-breakpoint
CREATE TABLE "fighters" (
	"id" serial PRIMARY KEY NOT NULL,
	"club_id" integer NOT NULL,
	"name" text NOT NULL,
	"club_name" text NOT NULL,
	"email" text,
	"photo_key" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "rule_set_versions" (
	"id" serial PRIMARY KEY NOT NULL,
	"rule_set_id" integer NOT NULL,
	"version" integer NOT NULL,
	"settings" jsonb NOT NULL,
	"created_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "rule_set_versions_version_unique" UNIQUE("rule_set_id","version"),
	CONSTRAINT "rule_set_versions_version_positive" CHECK ("rule_set_versions"."version" >= 1)
);
--> statement-breakpoint
CREATE TABLE "rule_sets" (
	"id" serial PRIMARY KEY NOT NULL,
	"club_id" integer NOT NULL,
	"name" text NOT NULL,
	"current_version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "tournaments" (
	"id" serial PRIMARY KEY NOT NULL,
	"event_id" integer NOT NULL,
	"name" text NOT NULL,
	"weapon" text NOT NULL,
	"rule_set_id" integer NOT NULL,
	"rule_set_version" integer NOT NULL,
	"frozen_rules" jsonb,
	"phase" "tournament_phase" DEFAULT 'entries' NOT NULL,
	"pool_size" integer DEFAULT 5 NOT NULL,
	"qualify_count" integer DEFAULT 4 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "tournaments_frozen_after_entries" CHECK (("tournaments"."phase" = 'entries') = ("tournaments"."frozen_rules" is null))
);
--> statement-breakpoint
ALTER TABLE "entries" ADD CONSTRAINT "entries_tournament_id_tournaments_id_fk" FOREIGN KEY ("tournament_id") REFERENCES "public"."tournaments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "entries" ADD CONSTRAINT "entries_fighter_id_fighters_id_fk" FOREIGN KEY ("fighter_id") REFERENCES "public"."fighters"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "entries" ADD CONSTRAINT "entries_checked_in_by_users_id_fk" FOREIGN KEY ("checked_in_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "events" ADD CONSTRAINT "events_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fighters" ADD CONSTRAINT "fighters_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rule_set_versions" ADD CONSTRAINT "rule_set_versions_rule_set_id_rule_sets_id_fk" FOREIGN KEY ("rule_set_id") REFERENCES "public"."rule_sets"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rule_set_versions" ADD CONSTRAINT "rule_set_versions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rule_sets" ADD CONSTRAINT "rule_sets_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tournaments" ADD CONSTRAINT "tournaments_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tournaments" ADD CONSTRAINT "tournaments_rule_set_version_fk" FOREIGN KEY ("rule_set_id","rule_set_version") REFERENCES "public"."rule_set_versions"("rule_set_id","version") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "entries_tournament_fighter_unique" ON "entries" USING btree ("tournament_id","fighter_id");--> statement-breakpoint
CREATE UNIQUE INDEX "entries_tournament_seed_unique" ON "entries" USING btree ("tournament_id","seed");--> statement-breakpoint
CREATE INDEX "entries_fighter_idx" ON "entries" USING btree ("fighter_id");--> statement-breakpoint
CREATE UNIQUE INDEX "events_club_slug_unique" ON "events" USING btree ("club_id","slug");--> statement-breakpoint
CREATE UNIQUE INDEX "fighters_club_person_unique" ON "fighters" USING btree ("club_id",lower("name"),lower("club_name"));--> statement-breakpoint
CREATE UNIQUE INDEX "rule_sets_club_name_unique" ON "rule_sets" USING btree ("club_id",lower("name"));--> statement-breakpoint
CREATE UNIQUE INDEX "tournaments_event_name_unique" ON "tournaments" USING btree ("event_id",lower("name"));--> statement-breakpoint
CREATE INDEX "tournaments_rule_set_idx" ON "tournaments" USING btree ("rule_set_id");