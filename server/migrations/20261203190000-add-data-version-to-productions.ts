import type { Migration } from "../migrator.js";

/**
 * `productions.data_version` changes with every committed write to a production's rows, so every app
 * server can tell whether something it computed from them (the snag list) is still current.
 *
 * - Each table with a `production_id` column gets three statement-level triggers (insert, update,
 *   delete; PostgreSQL allows transition tables for one event per trigger) that note the productions
 *   the statement touched in `production_data_changes`, once per production and transaction.
 * - A deferred constraint trigger on that table applies the bump at commit: the production row is
 *   locked only for the moment of the commit, so concurrent writers neither queue behind each other
 *   for their whole transaction nor deadlock on it.
 * - Versions come from one sequence, so a production deleted and created again (or a database
 *   reset in tests) never repeats a version an app server may still hold.
 * - A change to the production row itself (its settings) bumps it too.
 * A production-owned table added later is tracked by `track_all_production_data()`, which the
 * migrator runs after every migration run; tests/server/data-version.test.ts lists any that are not.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE SEQUENCE production_data_version_seq;
    ALTER TABLE productions ADD COLUMN data_version bigint NOT NULL DEFAULT nextval('production_data_version_seq');

    CREATE FUNCTION productions_bump_data_version() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.data_version IS NOT DISTINCT FROM OLD.data_version THEN
        NEW.data_version := nextval('production_data_version_seq');
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER productions_bump_data_version BEFORE UPDATE ON productions
      FOR EACH ROW EXECUTE FUNCTION productions_bump_data_version();

    CREATE TABLE production_data_changes (production_id uuid NOT NULL);

    CREATE FUNCTION note_production_data_change() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      pids uuid[];
      pid uuid;
      noted text := coalesce(current_setting('seamscene.noted_productions', true), '');
    BEGIN
      -- Each branch names only the transition tables its event has.
      IF TG_OP = 'INSERT' THEN
        pids := ARRAY(SELECT DISTINCT production_id FROM new_rows WHERE production_id IS NOT NULL);
      ELSIF TG_OP = 'DELETE' THEN
        pids := ARRAY(SELECT DISTINCT production_id FROM old_rows WHERE production_id IS NOT NULL);
      ELSE
        pids := ARRAY(SELECT production_id FROM new_rows WHERE production_id IS NOT NULL UNION SELECT production_id FROM old_rows WHERE production_id IS NOT NULL);
      END IF;
      FOREACH pid IN ARRAY pids LOOP
        IF position(pid::text IN noted) = 0 THEN
          INSERT INTO production_data_changes (production_id) VALUES (pid);
          noted := noted || pid::text || ' ';
        END IF;
      END LOOP;
      -- Transaction-local: a rolled-back savepoint forgets it together with the rows noted after it.
      PERFORM set_config('seamscene.noted_productions', noted, true);
      RETURN NULL;
    END $$;

    CREATE FUNCTION apply_production_data_change() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      DELETE FROM production_data_changes WHERE production_id = NEW.production_id;
      UPDATE productions SET data_version = nextval('production_data_version_seq') WHERE id = NEW.production_id;
      RETURN NULL;
    END $$;
    CREATE CONSTRAINT TRIGGER apply_production_data_change AFTER INSERT ON production_data_changes
      DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION apply_production_data_change();

    CREATE FUNCTION track_production_data(t regclass) RETURNS void LANGUAGE plpgsql AS $$
    BEGIN
      EXECUTE format('CREATE TRIGGER production_data_inserted AFTER INSERT ON %s REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION note_production_data_change()', t);
      EXECUTE format('CREATE TRIGGER production_data_updated AFTER UPDATE ON %s REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION note_production_data_change()', t);
      EXECUTE format('CREATE TRIGGER production_data_deleted AFTER DELETE ON %s REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION note_production_data_change()', t);
    END $$;

    -- Every production-owned table (a production_id column) not tracked yet. Called here and after
    -- every migration run (server/migrator.ts), so a table added later is tracked whatever its migration says.
    CREATE FUNCTION track_all_production_data() RETURNS text[] LANGUAGE plpgsql AS $$
    DECLARE
      t regclass;
      added text[] := '{}';
    BEGIN
      FOR t IN
        SELECT c.oid::regclass FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
         WHERE n.nspname = 'public' AND c.relkind = 'r' AND c.relname <> 'production_data_changes'
           AND EXISTS (SELECT 1 FROM pg_attribute a WHERE a.attrelid = c.oid AND a.attname = 'production_id' AND NOT a.attisdropped)
           AND NOT EXISTS (SELECT 1 FROM pg_trigger g WHERE g.tgrelid = c.oid AND g.tgname = 'production_data_inserted')
         ORDER BY c.relname
      LOOP
        PERFORM track_production_data(t);
        added := added || t::text;
      END LOOP;
      RETURN added;
    END $$;
    SELECT track_all_production_data();
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DO $$
    DECLARE r record;
    BEGIN
      FOR r IN SELECT tgrelid::regclass AS t, tgname FROM pg_trigger WHERE tgname IN ('production_data_inserted', 'production_data_updated', 'production_data_deleted') LOOP
        EXECUTE format('DROP TRIGGER %I ON %s', r.tgname, r.t);
      END LOOP;
    END $$;
    DROP FUNCTION track_all_production_data();
    DROP FUNCTION track_production_data(regclass);
    DROP TABLE production_data_changes;
    DROP FUNCTION apply_production_data_change();
    DROP FUNCTION note_production_data_change();
    DROP TRIGGER productions_bump_data_version ON productions;
    DROP FUNCTION productions_bump_data_version();
    ALTER TABLE productions DROP COLUMN data_version;
    DROP SEQUENCE production_data_version_seq;
  `);
};
