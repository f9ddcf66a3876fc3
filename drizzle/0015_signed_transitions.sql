-- The state changes that a signature vouches for need that signature, checked by the database at
-- commit whoever connects:
--   * a revision becomes approved only with a reviewer's approval signature written in the same
--     transaction, over the content hash the revision now records (revisions.content_hash, set
--     once, in the same UPDATE that approves it), by an active reviewer who neither wrote nor
--     edited it;
--   * a run sheet becomes signed only with a run signature written in the same transaction over
--     the content hash the run records;
--   * revisions are created as drafts and runs in progress, never further along.
-- The database cannot see a password: the server checks that before it writes the signature.
-- Audit rows take their time from the database clock, whatever the writer supplied.
ALTER TABLE public.revisions ADD COLUMN content_hash text;
--> statement-breakpoint
-- Revisions approved before: the hash their approval signature was made over.
UPDATE public.revisions r SET content_hash = s.content_hash
FROM public.signatures s
WHERE s.revision_id = r.id AND s.meaning = 'approved' AND r.state IN ('approved', 'superseded', 'withdrawn');
--> statement-breakpoint
-- "Written in this transaction": the row's xmin is this transaction's id. A signature written
-- inside a savepoint carries the savepoint's id and is not counted; signatures are written at
-- the top level of their transaction.
CREATE FUNCTION public.benchwright_written_here(row_xmin xid) RETURNS boolean
  LANGUAGE sql SET search_path = pg_catalog, public, pg_temp AS $$
  SELECT row_xmin = pg_current_xact_id()::xid
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_guard_revision() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  IF TG_OP = 'INSERT' THEN
    IF NEW.state IS DISTINCT FROM 'draft' OR NEW.content_hash IS NOT NULL THEN
      RAISE EXCEPTION 'a revision is created as a draft (not %) and goes through review from there', NEW.state USING ERRCODE = 'check_violation';
    END IF;
    RETURN NEW;
  END IF;
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
  IF NEW.content_hash IS DISTINCT FROM OLD.content_hash AND NOT (OLD.state = 'in_review' AND NEW.state = 'approved') THEN
    RAISE EXCEPTION 'revision %: its content hash is recorded once, as it is approved', OLD.id USING ERRCODE = 'check_violation';
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
$$;
--> statement-breakpoint
DROP TRIGGER revisions_guard ON public.revisions;
--> statement-breakpoint
CREATE TRIGGER revisions_guard BEFORE INSERT OR UPDATE OR DELETE ON public.revisions
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_guard_revision();
--> statement-breakpoint
-- At commit, for each revision that became approved in the transaction.
CREATE FUNCTION public.benchwright_require_approval_signature() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
  s record;
BEGIN
  SELECT id, content_hash, author_id, editor_ids INTO r FROM public.revisions WHERE id = NEW.id;
  SELECT sig.signer_id, sig.signer_name, sig.signer_role, sig.content_hash INTO s
  FROM public.signatures sig
  WHERE sig.revision_id = NEW.id AND sig.meaning = 'approved' AND public.benchwright_written_here(sig.xmin);
  IF NOT FOUND THEN
    RAISE EXCEPTION 'revision % cannot be approved without a reviewer''s approval signature written in the same transaction', NEW.id
      USING ERRCODE = 'integrity_constraint_violation';
  END IF;
  IF r.content_hash IS NULL OR s.content_hash IS DISTINCT FROM r.content_hash THEN
    RAISE EXCEPTION 'revision % cannot be approved: the signature is over content hash %, the revision records %', NEW.id, s.content_hash, COALESCE(r.content_hash, 'none')
      USING ERRCODE = 'integrity_constraint_violation';
  END IF;
  IF s.signer_role <> 'reviewer' OR NOT EXISTS (
    SELECT 1 FROM public.people p WHERE p.id = s.signer_id AND p.active AND 'reviewer' = ANY (p.roles)
  ) THEN
    RAISE EXCEPTION 'revision % cannot be approved: the signer % is not an active reviewer', NEW.id, s.signer_id
      USING ERRCODE = 'integrity_constraint_violation';
  END IF;
  IF s.signer_id = r.author_id OR s.signer_id = ANY (r.editor_ids) THEN
    RAISE EXCEPTION 'revision % cannot be approved: the signer % wrote or edited it', NEW.id, s.signer_id
      USING ERRCODE = 'integrity_constraint_violation';
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER revisions_approval_signed AFTER UPDATE ON public.revisions
  DEFERRABLE INITIALLY DEFERRED
  FOR EACH ROW WHEN (NEW.state = 'approved' AND OLD.state IS DISTINCT FROM 'approved')
  EXECUTE FUNCTION public.benchwright_require_approval_signature();
--> statement-breakpoint
-- Runs: created in progress; once signed, frozen (as before).
CREATE OR REPLACE FUNCTION public.benchwright_refuse_signed_run_row_change() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  IF TG_OP = 'INSERT' THEN
    IF NEW.status IS DISTINCT FROM 'in_progress' OR NEW.content_hash IS NOT NULL OR NEW.signed_at IS NOT NULL THEN
      RAISE EXCEPTION 'a run sheet is created in progress and signed afterwards, not created %', NEW.status USING ERRCODE = 'check_violation';
    END IF;
    RETURN NEW;
  END IF;
  IF OLD.status = 'signed' THEN
    RAISE EXCEPTION 'run sheet % is signed and cannot be changed', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
DROP TRIGGER runs_signed_guard ON public.runs;
--> statement-breakpoint
CREATE TRIGGER runs_signed_guard BEFORE INSERT OR UPDATE OR DELETE ON public.runs
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_signed_run_row_change();
--> statement-breakpoint
-- At commit, for each run sheet that became signed in the transaction.
CREATE FUNCTION public.benchwright_require_run_signature() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
BEGIN
  SELECT id, content_hash, revision_id, revision_hash INTO r FROM public.runs WHERE id = NEW.id;
  IF r.content_hash IS NULL OR NOT EXISTS (
    SELECT 1 FROM public.run_signatures s
    WHERE s.run_id = r.id AND s.content_hash = r.content_hash
      AND s.revision_id = r.revision_id AND s.revision_hash = r.revision_hash
      AND public.benchwright_written_here(s.xmin)
  ) THEN
    RAISE EXCEPTION 'run sheet % cannot be signed without its signature over content hash %, written in the same transaction', NEW.id, COALESCE(r.content_hash, 'none')
      USING ERRCODE = 'integrity_constraint_violation';
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER runs_signature_present AFTER UPDATE ON public.runs
  DEFERRABLE INITIALLY DEFERRED
  FOR EACH ROW WHEN (NEW.status = 'signed' AND OLD.status IS DISTINCT FROM 'signed')
  EXECUTE FUNCTION public.benchwright_require_run_signature();
--> statement-breakpoint
-- The audit row's time: the database clock, read under the chain's lock, so the log's time order
-- is its chain order. A supplied value is overwritten.
CREATE OR REPLACE FUNCTION public.benchwright_chain_audit() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  last record;
BEGIN
  PERFORM pg_advisory_xact_lock(hashtext('benchwright_audit_chain'));
  NEW.at := clock_timestamp();
  SELECT seq, row_hash INTO last FROM public.audit_log WHERE seq IS NOT NULL ORDER BY seq DESC LIMIT 1;
  NEW.seq := COALESCE(last.seq, 0) + 1;
  NEW.prev_hash := COALESCE(last.row_hash, repeat('0', 64));
  NEW.row_hash := encode(sha256(convert_to(public.benchwright_audit_text(NEW), 'UTF8')), 'hex');
  RETURN NEW;
END;
$$;
