-- Decisions and comments are append-only, and a release is never deleted or changed (issue 6): the only
-- UPDATE allowed sets the three withdrawal fields once, from null to non-null. So a version, once used,
-- stays used (withdrawn releases keep theirs) and a bundle is never rebuilt. TRUNCATE has its own trigger.
CREATE OR REPLACE FUNCTION tapwright_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION '% is append-only: % is not allowed', TG_TABLE_NAME, TG_OP USING ERRCODE = 'insufficient_privilege';
END $$;--> statement-breakpoint
CREATE TRIGGER reviews_append_only BEFORE UPDATE OR DELETE ON reviews
  FOR EACH ROW EXECUTE FUNCTION tapwright_append_only();--> statement-breakpoint
CREATE TRIGGER reviews_no_truncate BEFORE TRUNCATE ON reviews
  FOR EACH STATEMENT EXECUTE FUNCTION tapwright_append_only();--> statement-breakpoint
CREATE TRIGGER review_comments_append_only BEFORE UPDATE OR DELETE ON review_comments
  FOR EACH ROW EXECUTE FUNCTION tapwright_append_only();--> statement-breakpoint
CREATE TRIGGER review_comments_no_truncate BEFORE TRUNCATE ON review_comments
  FOR EACH STATEMENT EXECUTE FUNCTION tapwright_append_only();--> statement-breakpoint
CREATE OR REPLACE FUNCTION tapwright_guard_release() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'release % (%) cannot be deleted: withdraw it instead', OLD.id, OLD.version USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF OLD.withdrawn_at IS NOT NULL THEN
    RAISE EXCEPTION 'release % (%) is withdrawn and cannot change', OLD.id, OLD.version USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF NEW.id IS DISTINCT FROM OLD.id OR NEW.design_id IS DISTINCT FROM OLD.design_id
    OR NEW.revision_id IS DISTINCT FROM OLD.revision_id OR NEW.version IS DISTINCT FROM OLD.version
    OR NEW.major IS DISTINCT FROM OLD.major OR NEW.minor IS DISTINCT FROM OLD.minor OR NEW.patch IS DISTINCT FROM OLD.patch
    OR NEW.notes IS DISTINCT FROM OLD.notes OR NEW.released_by IS DISTINCT FROM OLD.released_by
    OR NEW.released_at IS DISTINCT FROM OLD.released_at OR NEW.content_hash IS DISTINCT FROM OLD.content_hash
    OR NEW.bundle IS DISTINCT FROM OLD.bundle OR NEW.bundle_sha256 IS DISTINCT FROM OLD.bundle_sha256
    OR NEW.bundle_size IS DISTINCT FROM OLD.bundle_size OR NEW.manifest IS DISTINCT FROM OLD.manifest
    OR NEW.withdrawn_at IS NULL THEN
    RAISE EXCEPTION 'release % (%) is immutable: only a withdrawal may be recorded', OLD.id, OLD.version USING ERRCODE = 'insufficient_privilege';
  END IF;
  RETURN NEW;
END $$;--> statement-breakpoint
CREATE TRIGGER releases_immutable BEFORE UPDATE OR DELETE ON releases
  FOR EACH ROW EXECUTE FUNCTION tapwright_guard_release();--> statement-breakpoint
CREATE TRIGGER releases_no_truncate BEFORE TRUNCATE ON releases
  FOR EACH STATEMENT EXECUTE FUNCTION tapwright_append_only();
