-- Every account has its change counter from the start, created in the same transaction as the account: a change made
-- while no counter row existed would otherwise be counted nowhere, and an answer computed meanwhile could be kept as
-- current. Existing accounts get theirs now; every counter moves on once, so that roster rows computed by earlier code
-- are computed again.
CREATE OR REPLACE FUNCTION roster_cache_create() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  INSERT INTO roster_cache (athlete_id) VALUES (NEW.id) ON CONFLICT DO NOTHING;
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE TRIGGER user_roster_cache_create AFTER INSERT ON "user" FOR EACH ROW EXECUTE FUNCTION roster_cache_create();
--> statement-breakpoint
INSERT INTO roster_cache (athlete_id) SELECT id FROM "user" ON CONFLICT DO NOTHING;
--> statement-breakpoint
UPDATE roster_cache SET generation = generation + 1;
