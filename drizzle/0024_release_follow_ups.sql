CREATE TABLE "follow_ups" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"run_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"procedure_id" uuid NOT NULL,
	"entry_ids" uuid[] NOT NULL,
	"owner_id" uuid NOT NULL,
	"disposition" text,
	"disposition_reason" text,
	"disposition_by" uuid,
	"disposition_at" timestamp with time zone,
	"closing_run_id" uuid,
	"closed_by" uuid,
	"closed_at" timestamp with time zone,
	"opened_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "follow_ups_disposition_ck" CHECK ("follow_ups"."disposition" in ('repair', 'accept', 'return')),
	CONSTRAINT "follow_ups_decided_ck" CHECK (("follow_ups"."disposition" is null) = ("follow_ups"."disposition_by" is null) and ("follow_ups"."disposition" is null) = ("follow_ups"."disposition_at" is null)
        and ("follow_ups"."disposition" is null or "follow_ups"."disposition" = 'repair' or length(btrim(coalesce("follow_ups"."disposition_reason", ''))) >= 3)),
	CONSTRAINT "follow_ups_closed_ck" CHECK (("follow_ups"."closed_at" is null) = ("follow_ups"."closed_by" is null)
        and ("follow_ups"."closing_run_id" is null or "follow_ups"."closed_at" is not null)
        and ("follow_ups"."closed_at" is null or "follow_ups"."closing_run_id" is not null or coalesce("follow_ups"."disposition", '') in ('accept', 'return')))
);
--> statement-breakpoint
CREATE TABLE "run_releases" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"run_id" uuid NOT NULL,
	"signer_id" uuid NOT NULL,
	"signer_name" text NOT NULL,
	"signer_role" text NOT NULL,
	"meaning" text DEFAULT 'released' NOT NULL,
	"content_hash" text NOT NULL,
	"request_id" text,
	"signed_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "run_releases_meaning_ck" CHECK ("run_releases"."meaning" = 'released')
);
--> statement-breakpoint
CREATE TABLE "unit_state_changes" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"unit_id" uuid NOT NULL,
	"state" text NOT NULL,
	"run_id" uuid,
	"reason" text,
	"by_id" uuid NOT NULL,
	"by_name" text NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "unit_state_changes_state_ck" CHECK ("unit_state_changes"."state" in ('on_bench', 'released', 'waiting_parts', 'returned')),
	CONSTRAINT "unit_state_changes_released_ck" CHECK ("unit_state_changes"."state" <> 'released' or "unit_state_changes"."run_id" is not null),
	CONSTRAINT "unit_state_changes_why_ck" CHECK ("unit_state_changes"."run_id" is not null or length(btrim(coalesce("unit_state_changes"."reason", ''))) >= 3)
);
--> statement-breakpoint
ALTER TABLE "follow_ups" ADD CONSTRAINT "follow_ups_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "follow_ups" ADD CONSTRAINT "follow_ups_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "follow_ups" ADD CONSTRAINT "follow_ups_procedure_id_procedures_id_fk" FOREIGN KEY ("procedure_id") REFERENCES "public"."procedures"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "follow_ups" ADD CONSTRAINT "follow_ups_owner_id_people_id_fk" FOREIGN KEY ("owner_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "follow_ups" ADD CONSTRAINT "follow_ups_disposition_by_people_id_fk" FOREIGN KEY ("disposition_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "follow_ups" ADD CONSTRAINT "follow_ups_closing_run_id_runs_id_fk" FOREIGN KEY ("closing_run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "follow_ups" ADD CONSTRAINT "follow_ups_closed_by_people_id_fk" FOREIGN KEY ("closed_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_releases" ADD CONSTRAINT "run_releases_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_releases" ADD CONSTRAINT "run_releases_signer_id_people_id_fk" FOREIGN KEY ("signer_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_state_changes" ADD CONSTRAINT "unit_state_changes_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_state_changes" ADD CONSTRAINT "unit_state_changes_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_state_changes" ADD CONSTRAINT "unit_state_changes_by_id_people_id_fk" FOREIGN KEY ("by_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "follow_ups_run_uq" ON "follow_ups" USING btree ("run_id");--> statement-breakpoint
CREATE INDEX "follow_ups_unit_idx" ON "follow_ups" USING btree ("unit_id");--> statement-breakpoint
CREATE INDEX "follow_ups_open_idx" ON "follow_ups" USING btree ("opened_at") WHERE "follow_ups"."closed_at" is null;--> statement-breakpoint
CREATE UNIQUE INDEX "run_releases_run_uq" ON "run_releases" USING btree ("run_id");--> statement-breakpoint
CREATE INDEX "unit_state_changes_unit_idx" ON "unit_state_changes" USING btree ("unit_id","id");--> statement-breakpoint
-- hand-written
-- Who may release a run: an active reviewer, or an active technician qualified for the run's
-- procedure family (and for live work when the run is live work).
CREATE FUNCTION public.benchwright_may_release(who uuid, run_id uuid) RETURNS boolean
  LANGUAGE sql STABLE SET search_path = pg_catalog, public, pg_temp AS $$
  SELECT EXISTS (
    SELECT 1 FROM public.people p, public.runs r JOIN public.revisions rev ON rev.id = r.revision_id
     WHERE p.id = who AND r.id = run_id AND p.active
       AND ('reviewer' = ANY (p.roles)
            OR ('technician' = ANY (p.roles)
                AND public.benchwright_qualified(who, rev.equipment_family, public.benchwright_run_is_live(r.revision_id)))))
$$;
--> statement-breakpoint
-- The release signature: only on a signed run, over its signed content hash, never by its performer,
-- by someone who may release it, and not while a follow-up on it stands in the way (open, returned
-- unrepaired, or closed by a later run: only a reviewer's acceptance lets the run itself be released).
CREATE FUNCTION public.benchwright_release_guard() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
  f record;
BEGIN
  SELECT id, status, performed_by, content_hash INTO r FROM public.runs WHERE id = NEW.run_id;
  IF r.status IS DISTINCT FROM 'signed' THEN
    RAISE EXCEPTION 'bench run % is not signed as performed; it cannot be released', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.signer_id = r.performed_by OR EXISTS (SELECT 1 FROM public.run_signatures s WHERE s.run_id = r.id AND s.signer_id = NEW.signer_id) THEN
    RAISE EXCEPTION 'bench run %: its performer cannot release it', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.content_hash IS DISTINCT FROM r.content_hash THEN
    RAISE EXCEPTION 'bench run %: the release must cover the signed content hash %', NEW.run_id, r.content_hash USING ERRCODE = 'check_violation';
  END IF;
  IF NOT public.benchwright_may_release(NEW.signer_id, NEW.run_id) THEN
    RAISE EXCEPTION 'bench run %: the releaser is neither a reviewer nor qualified for it', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  SELECT closed_at, closing_run_id, disposition INTO f FROM public.follow_ups WHERE follow_ups.run_id = NEW.run_id;
  IF FOUND AND NOT (f.closed_at IS NOT NULL AND f.closing_run_id IS NULL AND f.disposition = 'accept') THEN
    RAISE EXCEPTION 'bench run %: its follow-up is not closed by an accepted reason; it cannot be released', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER run_releases_guard BEFORE INSERT ON public.run_releases
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_release_guard();
--> statement-breakpoint
CREATE TRIGGER run_releases_append_only BEFORE UPDATE OR DELETE ON public.run_releases
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_append_only_change();
--> statement-breakpoint
REVOKE UPDATE, DELETE, TRUNCATE ON public.run_releases FROM benchwright_app;
--> statement-breakpoint
-- A unit's state: a run named must be a signed run on that unit, and "released" follows only its release.
CREATE FUNCTION public.benchwright_unit_state_guard() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  IF NEW.run_id IS NOT NULL AND NOT EXISTS (
    SELECT 1 FROM public.runs r WHERE r.id = NEW.run_id AND r.unit_id = NEW.unit_id AND r.status = 'signed'
  ) THEN
    RAISE EXCEPTION 'unit %: run % is not a signed run on this unit', NEW.unit_id, NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.state = 'released' AND NOT EXISTS (SELECT 1 FROM public.run_releases x WHERE x.run_id = NEW.run_id) THEN
    RAISE EXCEPTION 'unit %: released only by a release signature on run %', NEW.unit_id, NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER unit_state_changes_guard BEFORE INSERT ON public.unit_state_changes
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_unit_state_guard();
--> statement-breakpoint
CREATE TRIGGER unit_state_changes_append_only BEFORE UPDATE OR DELETE ON public.unit_state_changes
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_append_only_change();
--> statement-breakpoint
REVOKE UPDATE, DELETE, TRUNCATE ON public.unit_state_changes FROM benchwright_app;
--> statement-breakpoint
-- Follow-ups: opened only for a signed run's out-of-band readings; closed only by a later in-band
-- signed run of the same procedure on the same unit, by a reviewer's accepted reason, or by return
-- unrepaired with the unit recorded as returned; once closed, never changed or reopened; never deleted.
CREATE FUNCTION public.benchwright_follow_up_guard() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
  c record;
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'follow-up % cannot be deleted', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  SELECT id, unit_id, procedure_id, status, out_of_tolerance, signed_at INTO r FROM public.runs WHERE id = NEW.run_id;
  IF TG_OP = 'INSERT' THEN
    IF r.status IS DISTINCT FROM 'signed' OR NOT r.out_of_tolerance THEN
      RAISE EXCEPTION 'follow-up: run % is not a signed run with out-of-band readings', NEW.run_id USING ERRCODE = 'check_violation';
    END IF;
    IF NEW.unit_id IS DISTINCT FROM r.unit_id OR NEW.procedure_id IS DISTINCT FROM r.procedure_id THEN
      RAISE EXCEPTION 'follow-up: unit and procedure must be those of run %', NEW.run_id USING ERRCODE = 'check_violation';
    END IF;
    IF cardinality(NEW.entry_ids) = 0 OR EXISTS (
      SELECT 1 FROM unnest(NEW.entry_ids) AS e(id)
       WHERE NOT EXISTS (SELECT 1 FROM public.run_entries x WHERE x.id = e.id AND x.run_id = NEW.run_id AND x.within = false)
    ) THEN
      RAISE EXCEPTION 'follow-up: the readings named must be out-of-band readings of run %', NEW.run_id USING ERRCODE = 'check_violation';
    END IF;
    IF NEW.closed_at IS NOT NULL OR NEW.disposition IS NOT NULL THEN
      RAISE EXCEPTION 'follow-up: opened undecided and open' USING ERRCODE = 'check_violation';
    END IF;
    RETURN NEW;
  END IF;
  IF OLD.closed_at IS NOT NULL THEN
    RAISE EXCEPTION 'follow-up % is closed and cannot be reopened or changed', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.run_id <> OLD.run_id OR NEW.unit_id <> OLD.unit_id OR NEW.procedure_id <> OLD.procedure_id
     OR NEW.entry_ids <> OLD.entry_ids OR NEW.opened_at <> OLD.opened_at THEN
    RAISE EXCEPTION 'follow-up %: its run, unit, procedure, readings and opening time are fixed', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.disposition IN ('accept', 'return') AND NEW.closed_at IS NULL THEN
    RAISE EXCEPTION 'follow-up %: accepting or returning unrepaired closes it', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.disposition = 'accept' AND (NEW.closed_by IS DISTINCT FROM NEW.disposition_by OR NOT EXISTS (
    SELECT 1 FROM public.people p WHERE p.id = NEW.disposition_by AND p.active AND 'reviewer' = ANY (p.roles))) THEN
    RAISE EXCEPTION 'follow-up %: only a reviewer accepts the readings with a reason', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.closed_at IS NOT NULL AND NEW.closing_run_id IS NULL AND NEW.disposition = 'return' AND NOT EXISTS (
    SELECT 1 FROM public.unit_state_changes s WHERE s.unit_id = NEW.unit_id AND s.state = 'returned'
       AND s.id = (SELECT max(id) FROM public.unit_state_changes WHERE unit_id = NEW.unit_id)) THEN
    RAISE EXCEPTION 'follow-up %: returned unrepaired only with the unit recorded as returned', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.closing_run_id IS NOT NULL THEN
    SELECT id, unit_id, procedure_id, status, out_of_tolerance, signed_at INTO c FROM public.runs WHERE id = NEW.closing_run_id;
    IF c.id = NEW.run_id OR c.status IS DISTINCT FROM 'signed' OR c.out_of_tolerance
       OR c.unit_id <> NEW.unit_id OR c.procedure_id <> NEW.procedure_id OR c.signed_at < r.signed_at THEN
      RAISE EXCEPTION 'follow-up %: closed only by a later signed run of the same procedure on the same unit with every reading in band', OLD.id USING ERRCODE = 'check_violation';
    END IF;
    IF NEW.disposition IS DISTINCT FROM 'repair' THEN
      RAISE EXCEPTION 'follow-up %: a re-run closes it as repaired', OLD.id USING ERRCODE = 'check_violation';
    END IF;
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER follow_ups_guard BEFORE INSERT OR UPDATE OR DELETE ON public.follow_ups
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_follow_up_guard();
--> statement-breakpoint
REVOKE DELETE, TRUNCATE ON public.follow_ups FROM benchwright_app;
--> statement-breakpoint
-- At commit, for each run that became signed: out of band, it opened its follow-up; in band, no
-- earlier follow-up of the same procedure on the same unit is left open.
CREATE FUNCTION public.benchwright_follow_up_on_sign() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  IF NEW.out_of_tolerance AND NOT EXISTS (SELECT 1 FROM public.follow_ups f WHERE f.run_id = NEW.id) THEN
    RAISE EXCEPTION 'run sheet % has out-of-band readings and no follow-up', NEW.id USING ERRCODE = 'integrity_constraint_violation';
  END IF;
  IF NOT NEW.out_of_tolerance AND EXISTS (
    SELECT 1 FROM public.follow_ups f JOIN public.runs o ON o.id = f.run_id
     WHERE f.closed_at IS NULL AND f.unit_id = NEW.unit_id AND f.procedure_id = NEW.procedure_id AND o.signed_at <= NEW.signed_at
  ) THEN
    RAISE EXCEPTION 'run sheet % is in band and leaves an earlier follow-up on its unit open', NEW.id USING ERRCODE = 'integrity_constraint_violation';
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER runs_follow_up_present AFTER UPDATE ON public.runs
  DEFERRABLE INITIALLY DEFERRED
  FOR EACH ROW WHEN (NEW.status = 'signed' AND OLD.status IS DISTINCT FROM 'signed')
  EXECUTE FUNCTION public.benchwright_follow_up_on_sign();
--> statement-breakpoint
-- Run sheets signed before follow-ups existed: each one with out-of-band readings gets its follow-up,
-- owned by its performer, closed by the first later in-band run of the same procedure on the same unit.
INSERT INTO public.follow_ups (run_id, unit_id, procedure_id, entry_ids, owner_id, opened_at)
SELECT r.id, r.unit_id, r.procedure_id,
       array(SELECT e.id FROM public.run_entries e WHERE e.run_id = r.id AND e.within = false ORDER BY e.step_id),
       r.performed_by, r.signed_at
  FROM public.runs r
 WHERE r.status = 'signed' AND r.out_of_tolerance
   AND EXISTS (SELECT 1 FROM public.run_entries e WHERE e.run_id = r.id AND e.within = false)
   AND NOT EXISTS (SELECT 1 FROM public.follow_ups f WHERE f.run_id = r.id);
--> statement-breakpoint
UPDATE public.follow_ups f
   SET disposition = 'repair', disposition_by = c.performed_by, disposition_at = c.signed_at,
       closing_run_id = c.id, closed_by = c.performed_by, closed_at = c.signed_at
  FROM public.runs o,
       LATERAL (SELECT x.id, x.performed_by, x.signed_at FROM public.runs x
                 WHERE x.status = 'signed' AND NOT x.out_of_tolerance AND x.unit_id = o.unit_id
                   AND x.procedure_id = o.procedure_id AND x.signed_at >= o.signed_at AND x.id <> o.id
                 ORDER BY x.signed_at LIMIT 1) c
 WHERE o.id = f.run_id AND f.closed_at IS NULL;
