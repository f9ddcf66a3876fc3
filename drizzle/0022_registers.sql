CREATE TABLE "instruments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"identifier" text NOT NULL,
	"kind" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"calibration_due" date NOT NULL,
	"certificate_id" uuid,
	"lock_version" integer DEFAULT 1 NOT NULL,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "instruments_kind_ck" CHECK ("instruments"."kind" in ('meter', 'oscilloscope', 'variac-meter', 'insulation-tester'))
);
--> statement-breakpoint
CREATE TABLE "qualifications" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"person_id" uuid NOT NULL,
	"scope" text NOT NULL,
	"family" text,
	"note" text DEFAULT '' NOT NULL,
	"granted_by" uuid NOT NULL,
	"granted_at" timestamp with time zone DEFAULT now() NOT NULL,
	"withdrawn_by" uuid,
	"withdrawn_at" timestamp with time zone,
	"withdraw_reason" text,
	CONSTRAINT "qualifications_scope_ck" CHECK (("qualifications"."scope" = 'family' and "qualifications"."family" is not null) or ("qualifications"."scope" = 'live' and "qualifications"."family" is null)),
	CONSTRAINT "qualifications_withdrawn_ck" CHECK (("qualifications"."withdrawn_at" is null) = ("qualifications"."withdrawn_by" is null) and ("qualifications"."withdrawn_at" is null) = ("qualifications"."withdraw_reason" is null))
);
--> statement-breakpoint
CREATE TABLE "run_witness_signatures" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"run_id" uuid NOT NULL,
	"signer_id" uuid NOT NULL,
	"signer_name" text NOT NULL,
	"meaning" text DEFAULT 'witnessed' NOT NULL,
	"content_hash" text NOT NULL,
	"revision_id" uuid NOT NULL,
	"revision_hash" text NOT NULL,
	"request_id" text,
	"signed_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "run_witness_signatures_meaning_ck" CHECK ("run_witness_signatures"."meaning" = 'witnessed')
);
--> statement-breakpoint
ALTER TABLE "run_entries" ADD COLUMN "instrument_id" uuid;--> statement-breakpoint
ALTER TABLE "run_entries" ADD COLUMN "instrument_due" date;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "witness_id" uuid;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "default_instrument_id" uuid;--> statement-breakpoint
ALTER TABLE "instruments" ADD CONSTRAINT "instruments_certificate_id_attachments_id_fk" FOREIGN KEY ("certificate_id") REFERENCES "public"."attachments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "instruments" ADD CONSTRAINT "instruments_created_by_people_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "qualifications" ADD CONSTRAINT "qualifications_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "qualifications" ADD CONSTRAINT "qualifications_granted_by_people_id_fk" FOREIGN KEY ("granted_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "qualifications" ADD CONSTRAINT "qualifications_withdrawn_by_people_id_fk" FOREIGN KEY ("withdrawn_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_witness_signatures" ADD CONSTRAINT "run_witness_signatures_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_witness_signatures" ADD CONSTRAINT "run_witness_signatures_signer_id_people_id_fk" FOREIGN KEY ("signer_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_witness_signatures" ADD CONSTRAINT "run_witness_signatures_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "instruments_identifier_uq" ON "instruments" USING btree (lower("identifier"));--> statement-breakpoint
CREATE INDEX "qualifications_person_idx" ON "qualifications" USING btree ("person_id");--> statement-breakpoint
CREATE UNIQUE INDEX "qualifications_active_uq" ON "qualifications" USING btree ("person_id","scope",lower(coalesce("family", ''))) WHERE "qualifications"."withdrawn_at" is null;--> statement-breakpoint
CREATE INDEX "run_witness_signatures_run_idx" ON "run_witness_signatures" USING btree ("run_id");--> statement-breakpoint
ALTER TABLE "run_entries" ADD CONSTRAINT "run_entries_instrument_id_instruments_id_fk" FOREIGN KEY ("instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_witness_id_people_id_fk" FOREIGN KEY ("witness_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_default_instrument_id_instruments_id_fk" FOREIGN KEY ("default_instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
-- hand-written
-- Qualifications: whether a person, active, holds the procedure family and, for live work, the
-- live-work qualification. A run is live work when its revision carries a hazard note (the same rule
-- as shared/schemas/registers.ts).
CREATE FUNCTION public.benchwright_qualified(who uuid, fam text, live boolean) RETURNS boolean
  LANGUAGE sql STABLE SET search_path = pg_catalog, public, pg_temp AS $$
  SELECT EXISTS (SELECT 1 FROM public.people p WHERE p.id = who AND p.active)
     AND EXISTS (SELECT 1 FROM public.qualifications q
                  WHERE q.person_id = who AND q.withdrawn_at IS NULL AND q.scope = 'family' AND lower(q.family) = lower(fam))
     AND (NOT live OR EXISTS (SELECT 1 FROM public.qualifications q
                  WHERE q.person_id = who AND q.withdrawn_at IS NULL AND q.scope = 'live'))
$$;
--> statement-breakpoint
CREATE FUNCTION public.benchwright_run_is_live(rev uuid) RETURNS boolean
  LANGUAGE sql STABLE SET search_path = pg_catalog, public, pg_temp AS $$
  SELECT jsonb_path_exists(r.document, '$.** ? (@.type == "hazardNote")') FROM public.revisions r WHERE r.id = rev
$$;
--> statement-breakpoint
-- A run's performer must be qualified for it, or the run names a qualified witness who is someone
-- else; the witness is fixed when the run starts.
CREATE FUNCTION public.benchwright_run_qualification_guard() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  fam text;
  live boolean;
BEGIN
  IF TG_OP = 'UPDATE' AND NEW.witness_id IS DISTINCT FROM OLD.witness_id THEN
    RAISE EXCEPTION 'bench run %: the witness is named when the run starts and cannot be changed', NEW.id USING ERRCODE = 'check_violation';
  END IF;
  IF TG_OP = 'UPDATE' AND NEW.performed_by IS NOT DISTINCT FROM OLD.performed_by THEN
    RETURN NEW;
  END IF;
  SELECT equipment_family INTO fam FROM public.revisions WHERE id = NEW.revision_id;
  live := public.benchwright_run_is_live(NEW.revision_id);
  IF NEW.witness_id IS NOT NULL THEN
    IF NEW.witness_id = NEW.performed_by THEN
      RAISE EXCEPTION 'bench run %: the witness must be someone other than the performer', NEW.id USING ERRCODE = 'check_violation';
    END IF;
    IF NOT public.benchwright_qualified(NEW.witness_id, fam, live) THEN
      RAISE EXCEPTION 'bench run %: the witness is not qualified for % procedures%', NEW.id, fam, CASE WHEN live THEN ' with live work' ELSE '' END USING ERRCODE = 'check_violation';
    END IF;
  ELSIF NOT public.benchwright_qualified(NEW.performed_by, fam, live) THEN
    RAISE EXCEPTION 'bench run %: the performer is not qualified for % procedures%, and no witness is named', NEW.id, fam, CASE WHEN live THEN ' with live work' ELSE '' END USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
-- Named to fire after runs_signed_guard (triggers fire in name order), which says first what an insert may be.
CREATE TRIGGER runs_trainee_guard BEFORE INSERT OR UPDATE OF performed_by, witness_id ON public.runs
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_run_qualification_guard();
--> statement-breakpoint
-- The witness's co-signature: only by the run's named witness, still qualified, on an open run.
CREATE FUNCTION public.benchwright_witness_signature_guard() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
BEGIN
  SELECT run.status, run.witness_id, run.revision_id, rev.equipment_family, rev.state AS revision_state INTO r
    FROM public.runs run JOIN public.revisions rev ON rev.id = run.revision_id WHERE run.id = NEW.run_id;
  IF r.status IS DISTINCT FROM 'in_progress' THEN
    RAISE EXCEPTION 'bench run % is not open; it cannot be witnessed now', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  IF r.revision_state = 'withdrawn' THEN
    RAISE EXCEPTION 'bench run % is on hold: the revision it follows was withdrawn', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  IF r.witness_id IS DISTINCT FROM NEW.signer_id THEN
    RAISE EXCEPTION 'bench run %: only its named witness co-signs it', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  IF NOT public.benchwright_qualified(NEW.signer_id, r.equipment_family, public.benchwright_run_is_live(r.revision_id)) THEN
    RAISE EXCEPTION 'bench run %: the witness is no longer qualified for it', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER run_witness_signatures_guard BEFORE INSERT ON public.run_witness_signatures
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_witness_signature_guard();
--> statement-breakpoint
CREATE TRIGGER run_witness_signatures_append_only BEFORE UPDATE OR DELETE ON public.run_witness_signatures
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_append_only_change();
--> statement-breakpoint
REVOKE UPDATE, DELETE, TRUNCATE ON public.run_witness_signatures FROM benchwright_app;
--> statement-breakpoint
-- At commit: a witnessed run becomes signed only when its witness co-signed the very content signed.
CREATE FUNCTION public.benchwright_require_witness_signature() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
BEGIN
  SELECT id, witness_id, content_hash INTO r FROM public.runs WHERE id = NEW.id;
  IF r.witness_id IS NOT NULL AND NOT EXISTS (
    SELECT 1 FROM public.run_witness_signatures w
     WHERE w.run_id = r.id AND w.signer_id = r.witness_id AND w.content_hash = r.content_hash
  ) THEN
    RAISE EXCEPTION 'run sheet % cannot be signed without its witness''s co-signature over content hash %', NEW.id, COALESCE(r.content_hash, 'none')
      USING ERRCODE = 'integrity_constraint_violation';
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER runs_witness_present AFTER UPDATE ON public.runs
  DEFERRABLE INITIALLY DEFERRED
  FOR EACH ROW WHEN (NEW.status = 'signed' AND OLD.status IS DISTINCT FROM 'signed' AND NEW.witness_id IS NOT NULL)
  EXECUTE FUNCTION public.benchwright_require_witness_signature();
--> statement-breakpoint
-- An instrument past its calibration due date takes no reading.
CREATE FUNCTION public.benchwright_instrument_in_calibration() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  due date;
BEGIN
  IF NEW.instrument_id IS NULL OR (TG_OP = 'UPDATE' AND NEW.instrument_id IS NOT DISTINCT FROM OLD.instrument_id
       AND NEW.measured IS NOT DISTINCT FROM OLD.measured) THEN
    RETURN NEW;
  END IF;
  SELECT calibration_due INTO due FROM public.instruments WHERE id = NEW.instrument_id;
  IF due < current_date THEN
    RAISE EXCEPTION 'instrument % was due for calibration on % and takes no readings', NEW.instrument_id, due USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER run_entries_instrument_guard BEFORE INSERT OR UPDATE ON public.run_entries
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_instrument_in_calibration();
