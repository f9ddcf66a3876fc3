-- Integrity of reviewed records, enforced by the database whoever connects (the app, psql, a script).
--
-- 1. Revisions follow the review state machine, and once approved their content is frozen:
--    approved, superseded and withdrawn rows keep their content columns, and cannot be deleted.
CREATE OR REPLACE FUNCTION benchwright_guard_revision() RETURNS trigger AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    IF OLD.state IN ('approved', 'superseded', 'withdrawn') THEN
      RAISE EXCEPTION 'revision % is %: a reviewed record cannot be deleted', OLD.id, OLD.state USING ERRCODE = 'check_violation';
    END IF;
    RETURN OLD;
  END IF;
  IF OLD.state IN ('approved', 'superseded', 'withdrawn') AND (
       NEW.document IS DISTINCT FROM OLD.document
    OR NEW.snapshot IS DISTINCT FROM OLD.snapshot
    OR NEW.params IS DISTINCT FROM OLD.params
    OR NEW.html IS DISTINCT FROM OLD.html
    OR NEW.plain_text IS DISTINCT FROM OLD.plain_text
    OR NEW.title IS DISTINCT FROM OLD.title
    OR NEW.equipment_family IS DISTINCT FROM OLD.equipment_family
    OR NEW.equipment_model IS DISTINCT FROM OLD.equipment_model
    OR NEW.tags IS DISTINCT FROM OLD.tags
    OR NEW.number IS DISTINCT FROM OLD.number
    OR NEW.procedure_id IS DISTINCT FROM OLD.procedure_id
    OR NEW.author_id IS DISTINCT FROM OLD.author_id
    OR NEW.editor_ids IS DISTINCT FROM OLD.editor_ids
  ) THEN
    RAISE EXCEPTION 'revision % is %: its content cannot change', OLD.id, OLD.state USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.state IS DISTINCT FROM OLD.state AND NOT (
       (OLD.state = 'draft' AND NEW.state = 'in_review')
    OR (OLD.state = 'in_review' AND NEW.state IN ('approved', 'returned'))
    OR (OLD.state = 'approved' AND NEW.state IN ('superseded', 'withdrawn'))
  ) THEN
    RAISE EXCEPTION 'revision % cannot go from % to %', OLD.id, OLD.state, NEW.state USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER revisions_guard BEFORE UPDATE OR DELETE ON revisions
  FOR EACH ROW EXECUTE FUNCTION benchwright_guard_revision();
--> statement-breakpoint
-- 2. Append-only tables: signatures, review comments and the audit log.
CREATE OR REPLACE FUNCTION benchwright_refuse_record_change() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION '% is append-only: % refused', TG_TABLE_NAME, TG_OP USING ERRCODE = 'check_violation';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER signatures_append_only BEFORE UPDATE OR DELETE ON signatures
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_record_change();
--> statement-breakpoint
CREATE TRIGGER signatures_no_truncate BEFORE TRUNCATE ON signatures
  FOR EACH STATEMENT EXECUTE FUNCTION benchwright_refuse_record_change();
--> statement-breakpoint
CREATE TRIGGER review_comments_append_only BEFORE UPDATE OR DELETE ON review_comments
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_record_change();
--> statement-breakpoint
CREATE TRIGGER audit_log_append_only BEFORE UPDATE OR DELETE ON audit_log
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_record_change();
--> statement-breakpoint
CREATE TRIGGER audit_log_no_truncate BEFORE TRUNCATE ON audit_log
  FOR EACH STATEMENT EXECUTE FUNCTION benchwright_refuse_record_change();
--> statement-breakpoint
-- 3. A signature must match its revision: same procedure and number, and the revision already in the
--    state the signature means (the state change comes first in the same transaction). A signature
--    row cannot be made for, or copied to, a revision it does not describe.
ALTER TABLE signatures ADD CONSTRAINT signatures_meaning_ck CHECK (meaning IN ('approved', 'returned', 'withdrawn'));
--> statement-breakpoint
CREATE OR REPLACE FUNCTION benchwright_check_signature() RETURNS trigger AS $$
DECLARE
  r record;
BEGIN
  SELECT procedure_id, number, state INTO r FROM revisions WHERE id = NEW.revision_id;
  IF NOT FOUND OR r.procedure_id <> NEW.procedure_id OR r.number <> NEW.revision_number THEN
    RAISE EXCEPTION 'signature does not match revision %', NEW.revision_id USING ERRCODE = 'check_violation';
  END IF;
  IF r.state <> NEW.meaning THEN
    RAISE EXCEPTION 'a % signature needs revision % to be %, but it is %', NEW.meaning, NEW.revision_id, NEW.meaning, r.state
      USING ERRCODE = 'check_violation';
  END IF;
  -- The time of signing is always the database's, never a value sent by a client.
  NEW.signed_at := now();
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER signatures_match_revision BEFORE INSERT ON signatures
  FOR EACH ROW EXECUTE FUNCTION benchwright_check_signature();
