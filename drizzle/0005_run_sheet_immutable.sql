-- A signed run sheet is immutable: its entries, their history, its photos and its signature can no
-- longer be inserted, changed or deleted, whoever connects. The history and the signature are
-- append-only from the start.
CREATE OR REPLACE FUNCTION benchwright_refuse_signed_run_change() RETURNS trigger AS $$
DECLARE
  target uuid;
BEGIN
  IF TG_OP = 'DELETE' THEN target := OLD.run_id; ELSE target := NEW.run_id; END IF;
  IF EXISTS (SELECT 1 FROM runs WHERE id = target AND status = 'signed')
     OR (TG_OP <> 'INSERT' AND EXISTS (SELECT 1 FROM runs WHERE id = OLD.run_id AND status = 'signed')) THEN
    RAISE EXCEPTION 'run sheet % is signed and cannot be changed', target USING ERRCODE = 'check_violation';
  END IF;
  IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER run_entries_signed_guard BEFORE INSERT OR UPDATE OR DELETE ON run_entries
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_signed_run_change();
--> statement-breakpoint
CREATE TRIGGER run_photos_signed_guard BEFORE INSERT OR UPDATE OR DELETE ON run_photos
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_signed_run_change();
--> statement-breakpoint
CREATE TRIGGER run_entry_history_signed_guard BEFORE INSERT ON run_entry_history
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_signed_run_change();
--> statement-breakpoint
CREATE OR REPLACE FUNCTION benchwright_refuse_append_only_change() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION '% is append-only: % refused', TG_TABLE_NAME, TG_OP USING ERRCODE = 'check_violation';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER run_entry_history_append_only BEFORE UPDATE OR DELETE ON run_entry_history
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_append_only_change();
--> statement-breakpoint
CREATE TRIGGER run_signatures_append_only BEFORE UPDATE OR DELETE ON run_signatures
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_append_only_change();
--> statement-breakpoint
-- A run may be signed once (in_progress → signed); after that the run row itself is frozen.
CREATE OR REPLACE FUNCTION benchwright_refuse_signed_run_row_change() RETURNS trigger AS $$
BEGIN
  IF OLD.status = 'signed' THEN
    RAISE EXCEPTION 'run sheet % is signed and cannot be changed', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER runs_signed_guard BEFORE UPDATE OR DELETE ON runs
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_signed_run_row_change();
--> statement-breakpoint
-- A signature must point at a run that is being signed in the same transaction or still open.
CREATE TRIGGER run_signatures_signed_guard BEFORE INSERT ON run_signatures
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_signed_run_change();
