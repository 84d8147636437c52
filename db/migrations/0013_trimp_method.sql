ALTER TABLE "athlete_profile" ADD COLUMN "trimp_method" text;--> statement-breakpoint
ALTER TABLE "session_log" ADD COLUMN "trimp_method" text;--> statement-breakpoint
-- Logs with a TRIMP from a file: the method the import recorded in the file's summary.
UPDATE "session_log" l SET "trimp_method" = f."summary" ->> 'trimpMethod' FROM "activity_file" f WHERE f."log_id" = l."id" AND l."trimp" IS NOT NULL;--> statement-breakpoint
-- Each athlete keeps the method of their first TRIMP.
UPDATE "athlete_profile" p SET "trimp_method" = (SELECT l."trimp_method" FROM "session_log" l WHERE l."athlete_id" = p."user_id" AND l."trimp_method" IS NOT NULL ORDER BY l."date", l."created_at" LIMIT 1);
