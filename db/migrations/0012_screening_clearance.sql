CREATE TABLE "screening_clearance" (
	"id" text PRIMARY KEY NOT NULL,
	"athlete_id" text NOT NULL,
	"cleared_by" text NOT NULL,
	"role" text NOT NULL,
	"cleared_on" text NOT NULL,
	"note" text,
	"recorded_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "screening_clearance" ADD CONSTRAINT "screening_clearance_athlete_id_user_id_fk" FOREIGN KEY ("athlete_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "screening_clearance" ADD CONSTRAINT "screening_clearance_recorded_by_user_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "screening_clearance_athlete_idx" ON "screening_clearance" USING btree ("athlete_id","created_at");--> statement-breakpoint
-- The roster shows readiness: screenings and clearances bump the athlete's roster_cache generation like its other inputs.
CREATE TRIGGER screening_roster_cache AFTER INSERT OR UPDATE OR DELETE ON screening FOR EACH ROW EXECUTE FUNCTION roster_cache_touch('athlete_id');
--> statement-breakpoint
CREATE TRIGGER screening_clearance_roster_cache AFTER INSERT OR UPDATE OR DELETE ON screening_clearance FOR EACH ROW EXECUTE FUNCTION roster_cache_touch('athlete_id');
