-- audit_events is append-only, also for anyone with SQL access through the app's role.
-- UPDATE raises, except the one the foreign key makes when an account is deleted
-- (actor_user_id set to NULL, nothing else changed).
-- DELETE raises unless the session opted in with
--   SET LOCAL beadline.allow_audit_purge = 'on';
-- which is what deleting an organization (its audit rows cascade) or a retention purge must do.
CREATE OR REPLACE FUNCTION audit_events_append_only() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'UPDATE' THEN
    IF NEW.actor_user_id IS NULL AND OLD.actor_user_id IS NOT NULL
       AND (to_jsonb(NEW) - 'actor_user_id') = (to_jsonb(OLD) - 'actor_user_id') THEN
      RETURN NEW;
    END IF;
    RAISE EXCEPTION 'audit_events is append-only: rows cannot be updated'
      USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF coalesce(current_setting('beadline.allow_audit_purge', true), '') = 'on' THEN
    RETURN OLD;
  END IF;
  RAISE EXCEPTION 'audit_events is append-only: rows cannot be deleted (SET LOCAL beadline.allow_audit_purge = ''on'' to purge on purpose)'
    USING ERRCODE = 'insufficient_privilege';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER audit_events_append_only
  BEFORE UPDATE OR DELETE ON audit_events
  FOR EACH ROW EXECUTE FUNCTION audit_events_append_only();
--> statement-breakpoint
CREATE TRIGGER audit_events_no_truncate
  BEFORE TRUNCATE ON audit_events
  FOR EACH STATEMENT EXECUTE FUNCTION audit_events_append_only();
