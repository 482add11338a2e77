-- Submitted revisions are immutable at the database too (issue 4), so no code path can change them:
-- a non-draft revision keeps its content, hash, design and number and is never deleted; its coefficient
-- tables are never added, changed or removed; uploads are never changed or removed.
CREATE OR REPLACE FUNCTION tapwright_guard_revision() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    IF OLD.state <> 'draft' THEN
      RAISE EXCEPTION 'revision % is %, so it cannot be deleted', OLD.id, OLD.state USING ERRCODE = 'integrity_constraint_violation';
    END IF;
    RETURN OLD;
  END IF;
  IF OLD.state <> 'draft' AND (
    NEW.content IS DISTINCT FROM OLD.content OR NEW.content_hash IS DISTINCT FROM OLD.content_hash
    OR NEW.design_id IS DISTINCT FROM OLD.design_id OR NEW.number IS DISTINCT FROM OLD.number
    OR NEW.state = 'draft'
  ) THEN
    RAISE EXCEPTION 'revision % is %, so its content cannot change', OLD.id, OLD.state USING ERRCODE = 'integrity_constraint_violation';
  END IF;
  RETURN NEW;
END $$;--> statement-breakpoint
CREATE TRIGGER revisions_immutable BEFORE UPDATE OR DELETE ON revisions
  FOR EACH ROW EXECUTE FUNCTION tapwright_guard_revision();--> statement-breakpoint
CREATE OR REPLACE FUNCTION tapwright_guard_coefficient_table() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  s revision_state;
BEGIN
  IF TG_OP IN ('UPDATE', 'DELETE') THEN
    -- During a cascade from a deleted draft the revision row is already gone (s is null): allowed.
    SELECT state INTO s FROM revisions WHERE id = OLD.revision_id;
    IF s IS NOT NULL AND s <> 'draft' THEN
      RAISE EXCEPTION 'coefficient table % belongs to a % revision and cannot change', OLD.id, s USING ERRCODE = 'integrity_constraint_violation';
    END IF;
  END IF;
  IF TG_OP IN ('INSERT', 'UPDATE') THEN
    SELECT state INTO s FROM revisions WHERE id = NEW.revision_id;
    IF s IS NOT NULL AND s <> 'draft' THEN
      RAISE EXCEPTION 'revision % is %, so no table can be added to it', NEW.revision_id, s USING ERRCODE = 'integrity_constraint_violation';
    END IF;
    RETURN NEW;
  END IF;
  RETURN OLD;
END $$;--> statement-breakpoint
CREATE TRIGGER coefficient_tables_immutable BEFORE INSERT OR UPDATE OR DELETE ON coefficient_tables
  FOR EACH ROW EXECUTE FUNCTION tapwright_guard_coefficient_table();--> statement-breakpoint
CREATE OR REPLACE FUNCTION tapwright_guard_upload() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'upload % is kept as it was received and cannot be changed or deleted', OLD.id USING ERRCODE = 'integrity_constraint_violation';
END $$;--> statement-breakpoint
CREATE TRIGGER uploads_immutable BEFORE UPDATE OR DELETE ON uploads
  FOR EACH ROW EXECUTE FUNCTION tapwright_guard_upload();
