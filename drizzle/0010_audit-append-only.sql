-- The audit log only grows: an entry is never changed or removed, whoever asks (the app's role has
-- no UPDATE or DELETE on the table either; db/prepare.ts). The two things the database itself does
-- to an entry stay possible: a departed person's id becomes NULL (ON DELETE SET NULL) and a shop's
-- entries go with the shop (ON DELETE CASCADE); both arrive from a foreign key's own trigger, one
-- trigger level down.
CREATE OR REPLACE FUNCTION audit_events_append_only() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF pg_trigger_depth() > 1 THEN
    IF TG_OP = 'DELETE' THEN
      RETURN OLD;
    END IF;
    IF (to_jsonb(NEW) - 'actor_user_id') = (to_jsonb(OLD) - 'actor_user_id') AND NEW.actor_user_id IS NULL THEN
      RETURN NEW;
    END IF;
  END IF;
  RAISE EXCEPTION 'audit entries are never changed or removed'
    USING ERRCODE = '42501';
END
$$;
--> statement-breakpoint
CREATE TRIGGER audit_events_append_only
BEFORE UPDATE OR DELETE ON audit_events
FOR EACH ROW EXECUTE FUNCTION audit_events_append_only();
