-- A deliberate purge of audit rows (SET LOCAL beadline.allow_audit_purge = 'on') is a
-- maintenance task for the owner of the tables: anyone may set a custom setting, so the trigger
-- also asks that the session's login role be the owner of audit_events (or a member of it, which
-- every superuser is). The web app's role (DATABASE_URL) has no UPDATE, DELETE or TRUNCATE on
-- audit_events; this closes the one path left to it, deleting an organization whose audit rows
-- cascade, which runs with the table owner's rights.
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
  IF coalesce(current_setting('beadline.allow_audit_purge', true), '') = 'on'
     AND pg_has_role(session_user, (SELECT relowner FROM pg_class WHERE oid = TG_RELID), 'MEMBER') THEN
    RETURN OLD;
  END IF;
  RAISE EXCEPTION 'audit_events is append-only: rows cannot be deleted (connected as the owner of the tables, SET LOCAL beadline.allow_audit_purge = ''on'' to purge on purpose)'
    USING ERRCODE = 'insufficient_privilege';
END;
$$;
