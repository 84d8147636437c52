CREATE TYPE "public"."log_status" AS ENUM('done', 'partial', 'skipped');--> statement-breakpoint
CREATE TABLE "activity_file" (
	"id" text PRIMARY KEY NOT NULL,
	"athlete_id" text NOT NULL,
	"log_id" text NOT NULL,
	"filename" text NOT NULL,
	"format" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"start_time" timestamp with time zone,
	"summary" jsonb NOT NULL,
	"data" "bytea" NOT NULL,
	"uploaded_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "session_log" (
	"id" text PRIMARY KEY NOT NULL,
	"athlete_id" text NOT NULL,
	"planned_session_id" text,
	"date" text NOT NULL,
	"sport" text NOT NULL,
	"title" text NOT NULL,
	"status" "log_status" NOT NULL,
	"duration_min" real,
	"distance_km" real,
	"rpe" real,
	"notes" text DEFAULT '' NOT NULL,
	"skip_reason" text,
	"measured_min_by_zone" jsonb,
	"zone_measure" text,
	"zone_set_id" text,
	"hr_avg_bpm" real,
	"power_avg_w" real,
	"speed_avg_kmh" real,
	"trimp" real,
	"client_key" text,
	"logged_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "session_log_rpe_range" CHECK ("session_log"."rpe" IS NULL OR ("session_log"."rpe" >= 0 AND "session_log"."rpe" <= 10))
);
--> statement-breakpoint
ALTER TABLE "activity_file" ADD CONSTRAINT "activity_file_athlete_id_user_id_fk" FOREIGN KEY ("athlete_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "activity_file" ADD CONSTRAINT "activity_file_log_id_session_log_id_fk" FOREIGN KEY ("log_id") REFERENCES "public"."session_log"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "activity_file" ADD CONSTRAINT "activity_file_uploaded_by_user_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "session_log" ADD CONSTRAINT "session_log_athlete_id_user_id_fk" FOREIGN KEY ("athlete_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "session_log" ADD CONSTRAINT "session_log_planned_session_id_planned_session_id_fk" FOREIGN KEY ("planned_session_id") REFERENCES "public"."planned_session"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "session_log" ADD CONSTRAINT "session_log_zone_set_id_zone_set_id_fk" FOREIGN KEY ("zone_set_id") REFERENCES "public"."zone_set"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "session_log" ADD CONSTRAINT "session_log_logged_by_user_id_fk" FOREIGN KEY ("logged_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "activity_file_log_idx" ON "activity_file" USING btree ("log_id");--> statement-breakpoint
CREATE INDEX "activity_file_athlete_idx" ON "activity_file" USING btree ("athlete_id");--> statement-breakpoint
CREATE INDEX "session_log_athlete_date_idx" ON "session_log" USING btree ("athlete_id","date");--> statement-breakpoint
CREATE UNIQUE INDEX "session_log_planned_idx" ON "session_log" USING btree ("planned_session_id");--> statement-breakpoint
CREATE UNIQUE INDEX "session_log_client_key_idx" ON "session_log" USING btree ("athlete_id","client_key");