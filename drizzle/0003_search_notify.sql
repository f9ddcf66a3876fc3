-- Tell every Benchwright server when a procedure's revisions change state, so each keeps its
-- search index current. NOTIFY is delivered at commit, with the transaction that made the change.
CREATE OR REPLACE FUNCTION benchwright_notify_revision_change() RETURNS trigger AS $$
BEGIN
  IF TG_OP = 'INSERT' OR NEW.state IS DISTINCT FROM OLD.state THEN
    PERFORM pg_notify('benchwright_search', NEW.procedure_id::text);
  END IF;
  RETURN NULL;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER revisions_notify_search
  AFTER INSERT OR UPDATE OF state ON revisions
  FOR EACH ROW EXECUTE FUNCTION benchwright_notify_revision_change();
