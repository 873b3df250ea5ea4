-- Checkpoints are append-only like the trail they anchor. The refusing function names its table
-- (it said "audit_events" whatever the table; the trail's own message stays the same).
CREATE OR REPLACE FUNCTION audit_events_refuse_change() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION '% is append-only: % is refused', TG_TABLE_NAME, TG_OP
    USING ERRCODE = 'insufficient_privilege';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER audit_checkpoints_no_update_delete
  BEFORE UPDATE OR DELETE ON audit_checkpoints
  FOR EACH ROW EXECUTE FUNCTION audit_events_refuse_change();
--> statement-breakpoint
CREATE TRIGGER audit_checkpoints_no_truncate
  BEFORE TRUNCATE ON audit_checkpoints
  FOR EACH STATEMENT EXECUTE FUNCTION audit_events_refuse_change();
