CREATE TYPE "public"."test_end" AS ENUM('exhaustion', 'plan', 'stop_sign');--> statement-breakpoint
CREATE TYPE "public"."test_kind" AS ENUM('gas_exchange', 'talk', 'submax', 'manual');--> statement-breakpoint
CREATE TABLE "athlete_test" (
	"id" text PRIMARY KEY NOT NULL,
	"athlete_id" text NOT NULL,
	"kind" "test_kind" NOT NULL,
	"sport" text NOT NULL,
	"protocol" text NOT NULL,
	"test_date" text NOT NULL,
	"ended_by" "test_end" NOT NULL,
	"stop_sign" text,
	"body_mass_kg" real,
	"input" jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"detected" jsonb NOT NULL,
	"adjusted" jsonb,
	"adjusted_by" text,
	"adjusted_at" timestamp with time zone,
	"created_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "screening" (
	"id" text PRIMARY KEY NOT NULL,
	"athlete_id" text NOT NULL,
	"answers" jsonb NOT NULL,
	"any_yes" boolean NOT NULL,
	"notes" text,
	"recorded_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "test_file" (
	"test_id" text PRIMARY KEY NOT NULL,
	"filename" text NOT NULL,
	"content_type" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"data" "bytea" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "zone_set" (
	"id" text PRIMARY KEY NOT NULL,
	"athlete_id" text NOT NULL,
	"sport" text NOT NULL,
	"test_id" text,
	"effective_from" text NOT NULL,
	"model" text DEFAULT 'three' NOT NULL,
	"vt1" jsonb NOT NULL,
	"vt2" jsonb NOT NULL,
	"source" text NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "athlete_test" ADD CONSTRAINT "athlete_test_athlete_id_user_id_fk" FOREIGN KEY ("athlete_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "athlete_test" ADD CONSTRAINT "athlete_test_adjusted_by_user_id_fk" FOREIGN KEY ("adjusted_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "athlete_test" ADD CONSTRAINT "athlete_test_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "screening" ADD CONSTRAINT "screening_athlete_id_user_id_fk" FOREIGN KEY ("athlete_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "screening" ADD CONSTRAINT "screening_recorded_by_user_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_file" ADD CONSTRAINT "test_file_test_id_athlete_test_id_fk" FOREIGN KEY ("test_id") REFERENCES "public"."athlete_test"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "zone_set" ADD CONSTRAINT "zone_set_athlete_id_user_id_fk" FOREIGN KEY ("athlete_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "zone_set" ADD CONSTRAINT "zone_set_test_id_athlete_test_id_fk" FOREIGN KEY ("test_id") REFERENCES "public"."athlete_test"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "zone_set" ADD CONSTRAINT "zone_set_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "athlete_test_athlete_idx" ON "athlete_test" USING btree ("athlete_id","test_date");--> statement-breakpoint
CREATE INDEX "screening_athlete_idx" ON "screening" USING btree ("athlete_id","created_at");--> statement-breakpoint
CREATE INDEX "zone_set_athlete_idx" ON "zone_set" USING btree ("athlete_id","sport","effective_from");--> statement-breakpoint
CREATE UNIQUE INDEX "zone_set_test_idx" ON "zone_set" USING btree ("test_id");