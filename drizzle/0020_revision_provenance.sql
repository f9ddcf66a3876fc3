ALTER TABLE "revisions" ADD COLUMN "provenance_ids" uuid[] DEFAULT '{}'::uuid[] NOT NULL;
--> statement-breakpoint
ALTER TABLE "run_entry_history" ADD COLUMN "request_hash" text;
--> statement-breakpoint
-- Four eyes at commit also counts the authors of the revisions a draft was started from.
CREATE OR REPLACE FUNCTION public.benchwright_require_approval_signature() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
  s record;
BEGIN
  SELECT id, content_hash, author_id, editor_ids, provenance_ids INTO r FROM public.revisions WHERE id = NEW.id;
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
  IF s.signer_id = r.author_id OR s.signer_id = ANY (r.editor_ids) OR s.signer_id = ANY (r.provenance_ids) THEN
    RAISE EXCEPTION 'revision % cannot be approved: the signer % wrote or edited it, or a revision it was started from', NEW.id, s.signer_id
      USING ERRCODE = 'integrity_constraint_violation';
  END IF;
  RETURN NULL;
END;
$$;
