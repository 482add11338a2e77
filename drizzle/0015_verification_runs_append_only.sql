-- Verification runs are evidence: append-only at the database, like the audit trail and review decisions.
-- tapwright_append_only() comes from 0008_reviews_releases_guards.sql. TRUNCATE bypasses row triggers.
CREATE TRIGGER verification_runs_append_only BEFORE UPDATE OR DELETE ON verification_runs
  FOR EACH ROW EXECUTE FUNCTION tapwright_append_only();--> statement-breakpoint
CREATE TRIGGER verification_runs_no_truncate BEFORE TRUNCATE ON verification_runs
  FOR EACH STATEMENT EXECUTE FUNCTION tapwright_append_only();
