-- Every database function runs with a fixed search_path and names its tables with their schema.
-- PostgreSQL looks a relation up in the session's temporary schema before any other unless
-- pg_temp is put last, so a trigger that said "runs" could be shown a temporary "runs" made by
-- whoever was connected, with whatever rows they liked. Now: pg_catalog first, pg_temp last,
-- and public.<table> everywhere. A new function must do the same (tests/server/db-integrity.test.ts
-- lists every function in public and fails on one without the setting).
--
-- The bodies below are those of drizzle/0003, 0005, 0007, 0010 and 0012 with qualified names;
-- CREATE OR REPLACE keeps every trigger pointing at its function.
CREATE OR REPLACE FUNCTION public.benchwright_notify_revision_change() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  IF TG_OP = 'INSERT' OR NEW.state IS DISTINCT FROM OLD.state THEN
    PERFORM pg_notify('benchwright_search', NEW.procedure_id::text);
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_refuse_signed_run_change() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  target uuid;
BEGIN
  IF TG_OP = 'DELETE' THEN target := OLD.run_id; ELSE target := NEW.run_id; END IF;
  IF EXISTS (SELECT 1 FROM public.runs WHERE id = target AND status = 'signed')
     OR (TG_OP <> 'INSERT' AND EXISTS (SELECT 1 FROM public.runs WHERE id = OLD.run_id AND status = 'signed')) THEN
    RAISE EXCEPTION 'run sheet % is signed and cannot be changed', target USING ERRCODE = 'check_violation';
  END IF;
  IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_refuse_append_only_change() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  RAISE EXCEPTION '% is append-only: % refused', TG_TABLE_NAME, TG_OP USING ERRCODE = 'check_violation';
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_refuse_signed_run_row_change() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  IF OLD.status = 'signed' THEN
    RAISE EXCEPTION 'run sheet % is signed and cannot be changed', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_guard_revision() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
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
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_refuse_record_change() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  RAISE EXCEPTION '% is append-only: % refused', TG_TABLE_NAME, TG_OP USING ERRCODE = 'check_violation';
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_check_signature() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
BEGIN
  SELECT procedure_id, number, state INTO r FROM public.revisions WHERE id = NEW.revision_id;
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
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_refresh_listing(pid uuid) RETURNS void
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  -- One refresh per procedure at a time (see drizzle/0010).
  PERFORM pg_advisory_xact_lock(hashtext('benchwright_listing'), hashtext(pid::text));
  INSERT INTO public.procedure_listing AS l
    (procedure_id, audience, revision_id, number, state, title, equipment_family, equipment_model, tags, updated_at, approved_id, approved_number, owner_id)
  SELECT p.id, aud.audience, r.id, r.number, r.state, r.title, r.equipment_family, r.equipment_model, r.tags, r.updated_at, a.id, a.number, p.owner_id
  FROM public.procedures p
  CROSS JOIN (VALUES ('staff'), ('published')) AS aud(audience)
  JOIN LATERAL (
    SELECT id, number, state, title, equipment_family, equipment_model, tags, updated_at
    FROM public.revisions
    WHERE procedure_id = p.id AND (aud.audience = 'staff' OR state IN ('approved', 'superseded'))
    ORDER BY number DESC
    LIMIT 1
  ) r ON true
  LEFT JOIN public.revisions a ON a.procedure_id = p.id AND a.state = 'approved'
  WHERE p.id = pid
  ON CONFLICT (procedure_id, audience) DO UPDATE SET
    revision_id = EXCLUDED.revision_id,
    number = EXCLUDED.number,
    state = EXCLUDED.state,
    title = EXCLUDED.title,
    equipment_family = EXCLUDED.equipment_family,
    equipment_model = EXCLUDED.equipment_model,
    tags = EXCLUDED.tags,
    updated_at = EXCLUDED.updated_at,
    approved_id = EXCLUDED.approved_id,
    approved_number = EXCLUDED.approved_number,
    owner_id = EXCLUDED.owner_id;
  DELETE FROM public.procedure_listing l
  WHERE l.procedure_id = pid
    AND NOT EXISTS (
      SELECT 1 FROM public.revisions r
      WHERE r.procedure_id = pid AND (l.audience = 'staff' OR r.state IN ('approved', 'superseded'))
    );
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_listing_on_revision() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  PERFORM public.benchwright_refresh_listing(COALESCE(NEW.procedure_id, OLD.procedure_id));
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_listing_on_owner() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  PERFORM public.benchwright_refresh_listing(NEW.id);
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_audit_text(a public.audit_log) RETURNS text
  LANGUAGE sql IMMUTABLE SET search_path = pg_catalog, public, pg_temp AS $$
  SELECT concat_ws(chr(31),
    a.seq::text,
    a.id::text,
    to_char(a.at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"'),
    COALESCE(a.actor_id::text, '\N'),
    a.action,
    COALESCE(a.subject, '\N'),
    a.details::text,
    COALESCE(a.ip, '\N'),
    a.prev_hash)
$$;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION public.benchwright_chain_audit() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  last record;
BEGIN
  PERFORM pg_advisory_xact_lock(hashtext('benchwright_audit_chain'));
  SELECT seq, row_hash INTO last FROM public.audit_log WHERE seq IS NOT NULL ORDER BY seq DESC LIMIT 1;
  NEW.seq := COALESCE(last.seq, 0) + 1;
  NEW.prev_hash := COALESCE(last.row_hash, repeat('0', 64));
  NEW.row_hash := encode(sha256(convert_to(public.benchwright_audit_text(NEW), 'UTF8')), 'hex');
  RETURN NEW;
END;
$$;
--> statement-breakpoint
-- No temporary tables for the application role, nor for PUBLIC (which every role is in). A
-- database cloned from this one or restored from a dump does not inherit database privileges:
-- server/bootstrap/postgres.ts revokeTemporary runs the same after CREATE DATABASE.
DO $$
BEGIN
  EXECUTE format('REVOKE TEMPORARY ON DATABASE %I FROM PUBLIC, benchwright_app', current_database());
END
$$;
