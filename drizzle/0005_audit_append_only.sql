-- The audit trail is append-only at the database (issue 6): no code path, and no hand-typed SQL through
-- the app's role, can change or remove a row. TRUNCATE bypasses row triggers, so it has its own.
CREATE OR REPLACE FUNCTION tapwright_audit_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'audit_events is append-only: % is not allowed', TG_OP USING ERRCODE = 'insufficient_privilege';
END $$;--> statement-breakpoint
CREATE TRIGGER audit_events_no_update_delete BEFORE UPDATE OR DELETE ON audit_events
  FOR EACH ROW EXECUTE FUNCTION tapwright_audit_append_only();--> statement-breakpoint
CREATE TRIGGER audit_events_no_truncate BEFORE TRUNCATE ON audit_events
  FOR EACH STATEMENT EXECUTE FUNCTION tapwright_audit_append_only();
