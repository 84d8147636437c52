ALTER TABLE "activity_file" ADD COLUMN "content_hash" text;--> statement-breakpoint
-- Files imported before: hashed here; where one athlete already holds the same file twice, the later copies stay unhashed
-- (kept as they are) so that the unique index can be built.
UPDATE "activity_file" SET "content_hash" = encode(sha256("data"), 'hex');--> statement-breakpoint
UPDATE "activity_file" a SET "content_hash" = NULL WHERE EXISTS (SELECT 1 FROM "activity_file" b WHERE b."athlete_id" = a."athlete_id" AND b."content_hash" = a."content_hash" AND (b."created_at", b."id") < (a."created_at", a."id"));--> statement-breakpoint
CREATE UNIQUE INDEX "activity_file_athlete_hash_idx" ON "activity_file" USING btree ("athlete_id","content_hash");
