-- Every change to an organization's lab data gives the organization a new data version
-- (organization_data_versions, from organization_data_version_seq) in the same transaction, so a
-- result cached under the version it was read at (server/cache/results.ts) is never served after
-- the data changed, by this web instance or any other on the same database.
-- The triggers are deferred constraint triggers: the version row is locked only while the
-- transaction commits, after every other lock it takes, so concurrent writers of one organization
-- queue briefly at commit instead of risking a deadlock. One bump per organization and
-- transaction is enough; a transaction-local setting remembers which were bumped.
CREATE OR REPLACE FUNCTION bump_organization_data_version() RETURNS trigger
LANGUAGE plpgsql AS $$
DECLARE
  org text;
  bumped text;
BEGIN
  IF TG_OP = 'DELETE' THEN
    org := OLD.organization_id;
  ELSE
    org := NEW.organization_id;
  END IF;
  IF org IS NULL THEN
    RETURN NULL;
  END IF;
  bumped := coalesce(current_setting('beadline.data_versions_bumped', true), '');
  IF position(',' || org || ',' IN bumped) > 0 THEN
    RETURN NULL;
  END IF;
  INSERT INTO organization_data_versions AS v (organization_id, version)
    VALUES (org, nextval('organization_data_version_seq'))
    ON CONFLICT (organization_id) DO UPDATE SET version = nextval('organization_data_version_seq');
  PERFORM set_config('beadline.data_versions_bumped',
    CASE WHEN bumped = '' THEN ',' ELSE bumped END || org || ',', true);
  RETURN NULL;
END;
$$;
--> statement-breakpoint
DO $$
DECLARE
  t text;
BEGIN
  FOREACH t IN ARRAY ARRAY['coatings', 'specs', 'batches', 'samples', 'drops', 'analyses',
    'dynamic_measurements', 'dynamic_analyses', 'probe_liquids', 'reviews'] LOOP
    EXECUTE format(
      'CREATE CONSTRAINT TRIGGER %I AFTER INSERT OR UPDATE OR DELETE ON %I '
      'DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION bump_organization_data_version()',
      t || '_data_version', t);
  END LOOP;
END;
$$;
