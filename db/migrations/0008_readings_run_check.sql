-- Readings refer to their run through statement-level triggers instead of a row-level foreign key:
-- the foreign key's check ran once per reading (for a COPY of 10⁶ readings, 45 of 60 s on a busy
-- machine); these run once per statement, over the statement's new rows.

CREATE FUNCTION readings_run_exists() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  wanted integer;
  found integer;
BEGIN
  SELECT count(DISTINCT run_id) INTO wanted FROM new_rows;
  -- FOR KEY SHARE, as the foreign key's own check: the run cannot be deleted before this transaction ends.
  SELECT count(*) INTO found FROM (SELECT r.id FROM runs r WHERE r.id IN (SELECT DISTINCT run_id FROM new_rows) FOR KEY SHARE) locked;
  IF found <> wanted THEN
    RAISE EXCEPTION 'readings refer to a run that does not exist' USING ERRCODE = '23503';
  END IF;
  RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER readings_run_exists_insert AFTER INSERT ON readings REFERENCING NEW TABLE AS new_rows
  FOR EACH STATEMENT EXECUTE FUNCTION readings_run_exists();
--> statement-breakpoint
CREATE TRIGGER readings_run_exists_update AFTER UPDATE ON readings REFERENCING NEW TABLE AS new_rows
  FOR EACH STATEMENT EXECUTE FUNCTION readings_run_exists();
--> statement-breakpoint
-- ON DELETE CASCADE of the former foreign key.
CREATE FUNCTION runs_delete_readings() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  DELETE FROM readings WHERE run_id = OLD.id;
  RETURN OLD;
END $$;
--> statement-breakpoint
CREATE TRIGGER runs_delete_readings BEFORE DELETE ON runs FOR EACH ROW EXECUTE FUNCTION runs_delete_readings();
