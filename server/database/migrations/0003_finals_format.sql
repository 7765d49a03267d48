ALTER TABLE "brackets" ALTER COLUMN "state" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "tournaments" ADD COLUMN "finals_format" "bracket_format" DEFAULT 'bracket' NOT NULL;--> statement-breakpoint
ALTER TABLE "tournaments" ADD COLUMN "bronze_match" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "brackets" ADD COLUMN "field" jsonb DEFAULT '[]'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "brackets" ADD CONSTRAINT "brackets_state_of_format" CHECK (("brackets"."format" = 'bracket') = ("brackets"."state" is not null));--> statement-breakpoint
UPDATE "brackets" SET "field" = coalesce((
  SELECT jsonb_agg((s->>'fighterId')::int ORDER BY (s->>'seed')::int)
  FROM jsonb_array_elements("state"->'matches') m, jsonb_array_elements(m->'sides') s
  WHERE m->>'kind' = 'main' AND (m->>'round')::int = 1 AND s->>'fighterId' IS NOT NULL
), '[]'::jsonb) WHERE "format" = 'bracket';
