CREATE TABLE "data_versions" (
	"name" text PRIMARY KEY NOT NULL,
	"version" bigint DEFAULT 0 NOT NULL
);
--> statement-breakpoint
INSERT INTO "data_versions" ("name", "version") VALUES ('records', 0);
--> statement-breakpoint
-- Runs at commit (deferred), once per transaction: the counter's row is locked only for the
-- moment of the commit, and a reader that sees the new number also sees the committed rows.
CREATE OR REPLACE FUNCTION data_versions_bump_records() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF current_setting('qwell.records_bumped', true) = 'on' THEN
    RETURN NULL;
  END IF;
  PERFORM set_config('qwell.records_bumped', 'on', true);
  UPDATE data_versions SET version = version + 1 WHERE name = 'records';
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER runs_bump_records AFTER INSERT OR UPDATE OR DELETE ON runs
  DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION data_versions_bump_records();
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER balance_results_bump_records AFTER INSERT OR UPDATE OR DELETE ON balance_results
  DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION data_versions_bump_records();
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER projects_bump_records AFTER INSERT OR UPDATE OR DELETE ON projects
  DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION data_versions_bump_records();
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER project_members_bump_records AFTER INSERT OR UPDATE OR DELETE ON project_members
  DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION data_versions_bump_records();
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER people_bump_records_on_change AFTER INSERT OR DELETE ON people
  DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION data_versions_bump_records();
--> statement-breakpoint
-- Sign-in counters and session revocation change people rows too; only what answers show counts.
CREATE CONSTRAINT TRIGGER people_bump_records_on_update AFTER UPDATE ON people
  DEFERRABLE INITIALLY DEFERRED FOR EACH ROW
  WHEN (OLD.name IS DISTINCT FROM NEW.name OR OLD.role IS DISTINCT FROM NEW.role OR OLD.active IS DISTINCT FROM NEW.active)
  EXECUTE FUNCTION data_versions_bump_records();
--> statement-breakpoint
-- TRUNCATE has no row triggers; a statement trigger on it bumps the counter at once.
CREATE TRIGGER runs_truncate_bumps_records AFTER TRUNCATE ON runs
  FOR EACH STATEMENT EXECUTE FUNCTION data_versions_bump_records();
