CREATE TABLE "clips" (
	"id" serial PRIMARY KEY NOT NULL,
	"club_id" integer NOT NULL,
	"recording_id" integer NOT NULL,
	"match_id" integer,
	"bout_number" integer,
	"title" text NOT NULL,
	"start_ms" integer NOT NULL,
	"end_ms" integer NOT NULL,
	"mode" text NOT NULL,
	"status" text DEFAULT 'queued' NOT NULL,
	"progress" integer DEFAULT 0 NOT NULL,
	"object_key" text,
	"poster_key" text,
	"duration_ms" integer,
	"error" text,
	"created_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "clips_window" CHECK ("clips"."start_ms" >= 0 and "clips"."end_ms" > "clips"."start_ms"),
	CONSTRAINT "clips_progress" CHECK ("clips"."progress" between 0 and 100),
	CONSTRAINT "clips_status" CHECK ("clips"."status" in ('queued', 'cutting', 'ready', 'failed')),
	CONSTRAINT "clips_mode" CHECK ("clips"."mode" in ('copy', 'exact'))
);
--> statement-breakpoint
CREATE TABLE "mark_kinds" (
	"id" serial PRIMARY KEY NOT NULL,
	"club_id" integer NOT NULL,
	"name" text NOT NULL,
	"position" integer DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "marks" (
	"id" serial PRIMARY KEY NOT NULL,
	"clip_id" integer NOT NULL,
	"at_ms" integer NOT NULL,
	"kind_id" integer,
	"label" text NOT NULL,
	"comment" text DEFAULT '' NOT NULL,
	"entry_id" uuid,
	"created_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "marks_at_positive" CHECK ("marks"."at_ms" >= 0)
);
--> statement-breakpoint
CREATE TABLE "recordings" (
	"id" serial PRIMARY KEY NOT NULL,
	"club_id" integer NOT NULL,
	"event_id" integer NOT NULL,
	"ring_number" integer NOT NULL,
	"title" text NOT NULL,
	"file_name" text NOT NULL,
	"content_type" text NOT NULL,
	"bytes" bigint NOT NULL,
	"object_key" text NOT NULL,
	"upload_id" text,
	"part_size" integer NOT NULL,
	"status" text DEFAULT 'uploading' NOT NULL,
	"error" text,
	"duration_ms" integer,
	"frame_rate" double precision,
	"width" integer,
	"height" integer,
	"starts_at" timestamp with time zone,
	"start_source" text,
	"offset_ms" integer DEFAULT 0 NOT NULL,
	"uploaded_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "recordings_status" CHECK ("recordings"."status" in ('uploading', 'probing', 'ready', 'failed')),
	CONSTRAINT "recordings_ring_positive" CHECK ("recordings"."ring_number" >= 1)
);
--> statement-breakpoint
CREATE TABLE "post_revisions" (
	"id" serial PRIMARY KEY NOT NULL,
	"post_id" integer NOT NULL,
	"number" integer NOT NULL,
	"title" text NOT NULL,
	"summary" text NOT NULL,
	"body" text NOT NULL,
	"author_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "posts" (
	"id" serial PRIMARY KEY NOT NULL,
	"club_id" integer NOT NULL,
	"event_id" integer,
	"slug" text NOT NULL,
	"title" text NOT NULL,
	"summary" text DEFAULT '' NOT NULL,
	"body" text DEFAULT '' NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"publish_at" timestamp with time zone,
	"published_at" timestamp with time zone,
	"announced_at" timestamp with time zone,
	"author_id" integer,
	"published_by" integer,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "posts_status" CHECK ("posts"."status" in ('draft', 'review', 'published'))
);
--> statement-breakpoint
CREATE TABLE "subscribers" (
	"id" serial PRIMARY KEY NOT NULL,
	"club_id" integer NOT NULL,
	"email" text NOT NULL,
	"status" text DEFAULT 'pending' NOT NULL,
	"confirm_token_hash" text,
	"confirm_sent_at" timestamp with time zone,
	"unsubscribe_token" text NOT NULL,
	"confirmed_at" timestamp with time zone,
	"unsubscribed_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "subscribers_status" CHECK ("subscribers"."status" in ('pending', 'confirmed', 'unsubscribed'))
);
--> statement-breakpoint
ALTER TABLE "clips" ADD CONSTRAINT "clips_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clips" ADD CONSTRAINT "clips_recording_id_recordings_id_fk" FOREIGN KEY ("recording_id") REFERENCES "public"."recordings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clips" ADD CONSTRAINT "clips_match_id_matches_id_fk" FOREIGN KEY ("match_id") REFERENCES "public"."matches"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "clips" ADD CONSTRAINT "clips_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mark_kinds" ADD CONSTRAINT "mark_kinds_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "marks" ADD CONSTRAINT "marks_clip_id_clips_id_fk" FOREIGN KEY ("clip_id") REFERENCES "public"."clips"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "marks" ADD CONSTRAINT "marks_kind_id_mark_kinds_id_fk" FOREIGN KEY ("kind_id") REFERENCES "public"."mark_kinds"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "marks" ADD CONSTRAINT "marks_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recordings" ADD CONSTRAINT "recordings_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recordings" ADD CONSTRAINT "recordings_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "recordings" ADD CONSTRAINT "recordings_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "post_revisions" ADD CONSTRAINT "post_revisions_post_id_posts_id_fk" FOREIGN KEY ("post_id") REFERENCES "public"."posts"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "post_revisions" ADD CONSTRAINT "post_revisions_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "posts" ADD CONSTRAINT "posts_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "posts" ADD CONSTRAINT "posts_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "posts" ADD CONSTRAINT "posts_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "posts" ADD CONSTRAINT "posts_published_by_users_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "subscribers" ADD CONSTRAINT "subscribers_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "clips_recording_idx" ON "clips" USING btree ("recording_id");--> statement-breakpoint
CREATE INDEX "clips_match_idx" ON "clips" USING btree ("match_id");--> statement-breakpoint
CREATE UNIQUE INDEX "mark_kinds_club_name_unique" ON "mark_kinds" USING btree ("club_id",lower("name"));--> statement-breakpoint
CREATE INDEX "marks_clip_idx" ON "marks" USING btree ("clip_id","at_ms");--> statement-breakpoint
CREATE UNIQUE INDEX "recordings_object_key_unique" ON "recordings" USING btree ("object_key");--> statement-breakpoint
CREATE INDEX "recordings_event_ring_idx" ON "recordings" USING btree ("event_id","ring_number");--> statement-breakpoint
CREATE UNIQUE INDEX "post_revisions_number_unique" ON "post_revisions" USING btree ("post_id","number");--> statement-breakpoint
CREATE UNIQUE INDEX "posts_club_slug_unique" ON "posts" USING btree ("club_id","slug");--> statement-breakpoint
CREATE INDEX "posts_club_published_idx" ON "posts" USING btree ("club_id","published_at");--> statement-breakpoint
CREATE UNIQUE INDEX "subscribers_club_email_unique" ON "subscribers" USING btree ("club_id",lower("email"));--> statement-breakpoint
CREATE UNIQUE INDEX "subscribers_unsubscribe_token_unique" ON "subscribers" USING btree ("unsubscribe_token");