ALTER TABLE "athlete_profile" ADD COLUMN "max_hard_days" integer DEFAULT 3 NOT NULL;--> statement-breakpoint
ALTER TABLE "athlete_profile" ADD COLUMN "hard_days_back_to_back" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "athlete_profile" ADD COLUMN "volume_tolerance_pct" integer DEFAULT 15 NOT NULL;--> statement-breakpoint
ALTER TABLE "athlete_profile" ADD CONSTRAINT "athlete_profile_hard_days" CHECK ("athlete_profile"."max_hard_days" between 1 and 7);--> statement-breakpoint
ALTER TABLE "athlete_profile" ADD CONSTRAINT "athlete_profile_volume_tolerance" CHECK ("athlete_profile"."volume_tolerance_pct" between 5 and 50);