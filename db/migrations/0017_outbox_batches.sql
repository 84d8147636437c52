ALTER TABLE "outbox" ADD COLUMN "batch_key" text;--> statement-breakpoint
CREATE INDEX "outbox_batch_idx" ON "outbox" USING btree ("batch_key");