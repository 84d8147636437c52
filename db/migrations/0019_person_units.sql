ALTER TABLE "user" ADD COLUMN "units" text DEFAULT 'metric' NOT NULL;--> statement-breakpoint
ALTER TABLE "user" ADD CONSTRAINT "user_units" CHECK ("user"."units" in ('metric', 'imperial'));