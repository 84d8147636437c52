-- The weeks answer now proposes swapping a hard session for an easier template of the squad's library, so a change to a
-- squad's templates bumps the roster_cache generation of that squad's athletes: a stored answer never names a template
-- that changed or is gone.
CREATE OR REPLACE FUNCTION roster_cache_touch_squad() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  squad text;
BEGIN
  IF TG_OP = 'DELETE' THEN
    squad := OLD.squad_id;
  ELSE
    squad := NEW.squad_id;
  END IF;
  UPDATE roster_cache SET generation = generation + 1
  WHERE athlete_id IN (SELECT user_id FROM membership WHERE squad_id = squad AND role = 'athlete');
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE TRIGGER session_template_roster_cache AFTER INSERT OR UPDATE OR DELETE ON session_template FOR EACH ROW EXECUTE FUNCTION roster_cache_touch_squad();
