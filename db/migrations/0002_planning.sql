CREATE TABLE "planned_session" (
	"id" text PRIMARY KEY NOT NULL,
	"athlete_id" text NOT NULL,
	"date" text NOT NULL,
	"kind" text DEFAULT 'training' NOT NULL,
	"sport" text NOT NULL,
	"title" text NOT NULL,
	"template_id" text,
	"structure" jsonb NOT NULL,
	"total_s" integer NOT NULL,
	"minutes_by_zone" jsonb NOT NULL,
	"series_id" text,
	"detached" boolean DEFAULT false NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "season" (
	"id" text PRIMARY KEY NOT NULL,
	"athlete_id" text NOT NULL,
	"name" text NOT NULL,
	"sport" text NOT NULL,
	"start_date" text NOT NULL,
	"events" jsonb NOT NULL,
	"weekly_hours" real NOT NULL,
	"level" text NOT NULL,
	"retest_every_weeks" integer NOT NULL,
	"weeks" jsonb NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "session_series" (
	"id" text PRIMARY KEY NOT NULL,
	"athlete_id" text NOT NULL,
	"rrule" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "session_template" (
	"id" text PRIMARY KEY NOT NULL,
	"squad_id" text NOT NULL,
	"name" text NOT NULL,
	"sport" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"structure" jsonb NOT NULL,
	"total_s" integer NOT NULL,
	"minutes_by_zone" jsonb NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "planned_session" ADD CONSTRAINT "planned_session_athlete_id_user_id_fk" FOREIGN KEY ("athlete_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "planned_session" ADD CONSTRAINT "planned_session_template_id_session_template_id_fk" FOREIGN KEY ("template_id") REFERENCES "public"."session_template"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "planned_session" ADD CONSTRAINT "planned_session_series_id_session_series_id_fk" FOREIGN KEY ("series_id") REFERENCES "public"."session_series"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "planned_session" ADD CONSTRAINT "planned_session_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "season" ADD CONSTRAINT "season_athlete_id_user_id_fk" FOREIGN KEY ("athlete_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "season" ADD CONSTRAINT "season_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "session_series" ADD CONSTRAINT "session_series_athlete_id_user_id_fk" FOREIGN KEY ("athlete_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "session_template" ADD CONSTRAINT "session_template_squad_id_squad_id_fk" FOREIGN KEY ("squad_id") REFERENCES "public"."squad"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "session_template" ADD CONSTRAINT "session_template_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "planned_session_athlete_date_idx" ON "planned_session" USING btree ("athlete_id","date");--> statement-breakpoint
CREATE INDEX "planned_session_series_idx" ON "planned_session" USING btree ("series_id");--> statement-breakpoint
CREATE INDEX "season_athlete_idx" ON "season" USING btree ("athlete_id","start_date");--> statement-breakpoint
CREATE INDEX "session_template_squad_idx" ON "session_template" USING btree ("squad_id");