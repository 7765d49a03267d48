CREATE TABLE "mail_deliveries" (
	"id" serial PRIMARY KEY NOT NULL,
	"mailing_id" integer NOT NULL,
	"subscriber_id" integer,
	"fighter_id" integer,
	"recipient" text NOT NULL,
	"email" text NOT NULL,
	"status" text DEFAULT 'sending' NOT NULL,
	"error" text,
	"claimed_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone,
	CONSTRAINT "mail_deliveries_status" CHECK ("mail_deliveries"."status" in ('sending', 'sent', 'failed'))
);
--> statement-breakpoint
CREATE TABLE "mailings" (
	"id" serial PRIMARY KEY NOT NULL,
	"club_id" integer NOT NULL,
	"kind" text NOT NULL,
	"post_id" integer,
	"tournament_id" integer,
	"subject" text NOT NULL,
	"status" text DEFAULT 'queued' NOT NULL,
	"total" integer DEFAULT 0 NOT NULL,
	"sent" integer DEFAULT 0 NOT NULL,
	"failed" integer DEFAULT 0 NOT NULL,
	"error" text,
	"job_id" text,
	"requested_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	CONSTRAINT "mailings_kind" CHECK (("mailings"."kind" = 'post' and "mailings"."post_id" is not null) or ("mailings"."kind" = 'cards' and "mailings"."tournament_id" is not null)),
	CONSTRAINT "mailings_status" CHECK ("mailings"."status" in ('queued', 'running', 'done', 'failed'))
);
--> statement-breakpoint
CREATE TABLE "subscribe_requests" (
	"id" serial PRIMARY KEY NOT NULL,
	"club_id" integer NOT NULL,
	"ip" text NOT NULL,
	"requested_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "clips" ADD COLUMN "requested_mode" text DEFAULT 'auto' NOT NULL;--> statement-breakpoint
ALTER TABLE "clips" ADD COLUMN "tolerance_ms" integer DEFAULT 500 NOT NULL;--> statement-breakpoint
ALTER TABLE "clips" ADD COLUMN "cut_start_ms" integer;--> statement-breakpoint
ALTER TABLE "mail_deliveries" ADD CONSTRAINT "mail_deliveries_mailing_id_mailings_id_fk" FOREIGN KEY ("mailing_id") REFERENCES "public"."mailings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mail_deliveries" ADD CONSTRAINT "mail_deliveries_subscriber_id_subscribers_id_fk" FOREIGN KEY ("subscriber_id") REFERENCES "public"."subscribers"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mail_deliveries" ADD CONSTRAINT "mail_deliveries_fighter_id_fighters_id_fk" FOREIGN KEY ("fighter_id") REFERENCES "public"."fighters"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mailings" ADD CONSTRAINT "mailings_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mailings" ADD CONSTRAINT "mailings_post_id_posts_id_fk" FOREIGN KEY ("post_id") REFERENCES "public"."posts"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mailings" ADD CONSTRAINT "mailings_tournament_id_tournaments_id_fk" FOREIGN KEY ("tournament_id") REFERENCES "public"."tournaments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mailings" ADD CONSTRAINT "mailings_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "subscribe_requests" ADD CONSTRAINT "subscribe_requests_club_id_clubs_id_fk" FOREIGN KEY ("club_id") REFERENCES "public"."clubs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "mail_deliveries_recipient_unique" ON "mail_deliveries" USING btree ("mailing_id","recipient");--> statement-breakpoint
CREATE INDEX "mailings_club_idx" ON "mailings" USING btree ("club_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "mailings_post_unique" ON "mailings" USING btree ("post_id");--> statement-breakpoint
CREATE UNIQUE INDEX "mailings_tournament_unique" ON "mailings" USING btree ("tournament_id");--> statement-breakpoint
CREATE INDEX "subscribe_requests_ip_idx" ON "subscribe_requests" USING btree ("ip","requested_at");--> statement-breakpoint
ALTER TABLE "clips" ADD CONSTRAINT "clips_requested_mode" CHECK ("clips"."requested_mode" in ('auto', 'copy', 'exact'));--> statement-breakpoint
ALTER TABLE "clips" ADD CONSTRAINT "clips_tolerance" CHECK ("clips"."tolerance_ms" >= 0);