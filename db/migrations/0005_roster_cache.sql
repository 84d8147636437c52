CREATE TABLE "roster_cache" (
	"athlete_id" text PRIMARY KEY NOT NULL,
	"generation" bigint DEFAULT 0 NOT NULL,
	"computed_generation" bigint,
	"computed_for" text,
	"row" jsonb,
	"computed_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "roster_cache" ADD CONSTRAINT "roster_cache_athlete_id_user_id_fk" FOREIGN KEY ("athlete_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;