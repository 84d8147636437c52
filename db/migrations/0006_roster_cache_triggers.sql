-- Any change to a row the roster reads bumps that athlete's roster_cache generation, so a cached roster row is never
-- used after its inputs changed, whichever code path changed them. Only existing cache rows are touched (nothing to
-- invalidate otherwise), which also keeps cascading deletes of a user free of foreign-key trouble.
CREATE OR REPLACE FUNCTION roster_cache_touch() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  col text := TG_ARGV[0];
BEGIN
  IF TG_OP IN ('UPDATE', 'DELETE') THEN
    UPDATE roster_cache SET generation = generation + 1 WHERE athlete_id = (to_jsonb(OLD) ->> col);
  END IF;
  IF TG_OP IN ('INSERT', 'UPDATE') THEN
    UPDATE roster_cache SET generation = generation + 1 WHERE athlete_id = (to_jsonb(NEW) ->> col);
  END IF;
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE TRIGGER planned_session_roster_cache AFTER INSERT OR UPDATE OR DELETE ON planned_session FOR EACH ROW EXECUTE FUNCTION roster_cache_touch('athlete_id');
--> statement-breakpoint
CREATE TRIGGER session_log_roster_cache AFTER INSERT OR UPDATE OR DELETE ON session_log FOR EACH ROW EXECUTE FUNCTION roster_cache_touch('athlete_id');
--> statement-breakpoint
CREATE TRIGGER athlete_test_roster_cache AFTER INSERT OR UPDATE OR DELETE ON athlete_test FOR EACH ROW EXECUTE FUNCTION roster_cache_touch('athlete_id');
--> statement-breakpoint
CREATE TRIGGER zone_set_roster_cache AFTER INSERT OR UPDATE OR DELETE ON zone_set FOR EACH ROW EXECUTE FUNCTION roster_cache_touch('athlete_id');
--> statement-breakpoint
CREATE TRIGGER season_roster_cache AFTER INSERT OR UPDATE OR DELETE ON season FOR EACH ROW EXECUTE FUNCTION roster_cache_touch('athlete_id');
--> statement-breakpoint
CREATE TRIGGER athlete_profile_roster_cache AFTER INSERT OR UPDATE OR DELETE ON athlete_profile FOR EACH ROW EXECUTE FUNCTION roster_cache_touch('user_id');
--> statement-breakpoint
CREATE TRIGGER user_roster_cache AFTER UPDATE ON "user" FOR EACH ROW EXECUTE FUNCTION roster_cache_touch('id');
