CREATE TABLE "run_holds" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"run_id" uuid NOT NULL,
	"step_id" text NOT NULL,
	"entry_version" integer NOT NULL,
	"raw" text NOT NULL,
	"measured" double precision NOT NULL,
	"unit" text NOT NULL,
	"low" double precision,
	"high" double precision,
	"opened_by" uuid NOT NULL,
	"opened_at" timestamp with time zone DEFAULT now() NOT NULL,
	"decision" text,
	"reason" text,
	"decided_by" uuid,
	"decided_by_name" text,
	"decided_at" timestamp with time zone,
	CONSTRAINT "run_holds_decision_ck" CHECK (("run_holds"."decision" is null and "run_holds"."reason" is null and "run_holds"."decided_by" is null and "run_holds"."decided_by_name" is null and "run_holds"."decided_at" is null)
       or ("run_holds"."decision" in ('continue', 'abandon') and length(btrim("run_holds"."reason")) >= 3 and "run_holds"."decided_by" is not null and "run_holds"."decided_by_name" is not null and "run_holds"."decided_at" is not null))
);
--> statement-breakpoint
CREATE TABLE "run_step_exceptions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"run_id" uuid NOT NULL,
	"step_id" text NOT NULL,
	"kind" text NOT NULL,
	"reason" text NOT NULL,
	"recorded_by" uuid NOT NULL,
	"recorded_by_name" text NOT NULL,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL,
	"decision" text,
	"decision_note" text,
	"decided_by" uuid,
	"decided_by_name" text,
	"decided_at" timestamp with time zone,
	CONSTRAINT "run_step_exceptions_kind_ck" CHECK ("run_step_exceptions"."kind" in ('not_applicable', 'deviation')),
	CONSTRAINT "run_step_exceptions_reason_ck" CHECK (length(btrim("run_step_exceptions"."reason")) >= 3),
	CONSTRAINT "run_step_exceptions_decision_ck" CHECK (("run_step_exceptions"."decision" is null and "run_step_exceptions"."decision_note" is null and "run_step_exceptions"."decided_by" is null and "run_step_exceptions"."decided_by_name" is null and "run_step_exceptions"."decided_at" is null)
       or ("run_step_exceptions"."kind" = 'deviation' and "run_step_exceptions"."decision" in ('approved', 'refused') and length(btrim("run_step_exceptions"."decision_note")) >= 3 and "run_step_exceptions"."decided_by" is not null and "run_step_exceptions"."decided_by_name" is not null and "run_step_exceptions"."decided_at" is not null))
);
--> statement-breakpoint
ALTER TABLE "run_holds" ADD CONSTRAINT "run_holds_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_holds" ADD CONSTRAINT "run_holds_opened_by_people_id_fk" FOREIGN KEY ("opened_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_holds" ADD CONSTRAINT "run_holds_decided_by_people_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_step_exceptions" ADD CONSTRAINT "run_step_exceptions_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_step_exceptions" ADD CONSTRAINT "run_step_exceptions_recorded_by_people_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_step_exceptions" ADD CONSTRAINT "run_step_exceptions_decided_by_people_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "run_holds_run_idx" ON "run_holds" USING btree ("run_id");--> statement-breakpoint
CREATE INDEX "run_step_exceptions_run_idx" ON "run_step_exceptions" USING btree ("run_id");--> statement-breakpoint
-- hand-written
-- Hold points and step exceptions. A senior is an active reviewer or admin; the person performing
-- the run (or who recorded the exception) never decides on it.
CREATE FUNCTION public.benchwright_is_senior(who uuid) RETURNS boolean
  LANGUAGE sql STABLE SET search_path = pg_catalog, public, pg_temp AS $$
  SELECT EXISTS (SELECT 1 FROM public.people p WHERE p.id = who AND p.active AND p.roles && ARRAY['reviewer', 'admin']::text[])
$$;
--> statement-breakpoint
-- While a hold point waits for its decision nothing more is entered on the run and it is not signed.
CREATE FUNCTION public.benchwright_refuse_while_held() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  IF EXISTS (SELECT 1 FROM public.run_holds h WHERE h.run_id = NEW.run_id AND h.decision IS NULL) THEN
    RAISE EXCEPTION 'bench run % is stopped at a hold point until a senior decides', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER run_entries_hold_point_guard BEFORE INSERT OR UPDATE ON public.run_entries
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_while_held();
--> statement-breakpoint
CREATE TRIGGER run_entry_history_hold_point_guard BEFORE INSERT ON public.run_entry_history
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_while_held();
--> statement-breakpoint
CREATE TRIGGER run_step_exceptions_hold_point_guard BEFORE INSERT ON public.run_step_exceptions
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_while_held();
--> statement-breakpoint
CREATE TRIGGER run_witness_signatures_hold_point_guard BEFORE INSERT ON public.run_witness_signatures
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_while_held();
--> statement-breakpoint
CREATE TRIGGER run_signatures_hold_point_guard BEFORE INSERT ON public.run_signatures
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_while_held();
--> statement-breakpoint
-- A deviation waiting for a senior's decision keeps the run from being signed or witnessed.
CREATE FUNCTION public.benchwright_refuse_awaiting_deviation() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  IF EXISTS (SELECT 1 FROM public.run_step_exceptions x
              WHERE x.run_id = NEW.run_id AND x.kind = 'deviation' AND x.decision IS NULL) THEN
    RAISE EXCEPTION 'bench run % has a deviation waiting for a senior''s decision', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER run_signatures_deviation_guard BEFORE INSERT ON public.run_signatures
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_awaiting_deviation();
--> statement-breakpoint
CREATE TRIGGER run_witness_signatures_deviation_guard BEFORE INSERT ON public.run_witness_signatures
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_awaiting_deviation();
--> statement-breakpoint
-- A hold is opened undecided, by the run's performer, on a step of the run marked as a hold point;
-- its decision is written once by a senior who does not perform the run, at the database's time,
-- and never changed; no hold is deleted.
CREATE FUNCTION public.benchwright_run_hold_guard() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'hold % is part of the run''s record and cannot be deleted', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  SELECT status, performed_by, steps INTO r FROM public.runs WHERE id = NEW.run_id;
  IF TG_OP = 'INSERT' THEN
    IF NEW.decision IS NOT NULL THEN
      RAISE EXCEPTION 'a hold is opened undecided' USING ERRCODE = 'check_violation';
    END IF;
    IF NOT EXISTS (SELECT 1 FROM jsonb_array_elements(r.steps) s
                    WHERE s ->> 'id' = NEW.step_id AND (s ->> 'holdPoint')::boolean IS TRUE) THEN
      RAISE EXCEPTION 'step % of bench run % is not a hold point', NEW.step_id, NEW.run_id USING ERRCODE = 'check_violation';
    END IF;
    RETURN NEW;
  END IF;
  IF OLD.decision IS NOT NULL THEN
    RAISE EXCEPTION 'hold % was decided and cannot be changed', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF (NEW.id, NEW.run_id, NEW.step_id, NEW.entry_version, NEW.raw, NEW.measured, NEW.unit, NEW.low, NEW.high, NEW.opened_by, NEW.opened_at)
     IS DISTINCT FROM (OLD.id, OLD.run_id, OLD.step_id, OLD.entry_version, OLD.raw, OLD.measured, OLD.unit, OLD.low, OLD.high, OLD.opened_by, OLD.opened_at) THEN
    RAISE EXCEPTION 'hold %: only its decision is written', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.decision IS NULL THEN
    RAISE EXCEPTION 'hold %: a decision is continue or abandon', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF r.status IS DISTINCT FROM 'in_progress' THEN
    RAISE EXCEPTION 'bench run % is not open; its hold cannot be decided', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  IF NOT public.benchwright_is_senior(NEW.decided_by) THEN
    RAISE EXCEPTION 'hold %: only an active reviewer or admin decides', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.decided_by = r.performed_by OR NEW.decided_by = OLD.opened_by THEN
    RAISE EXCEPTION 'hold %: the technician on the run does not decide its hold', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  NEW.decided_at := now();
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER run_holds_guard BEFORE INSERT OR UPDATE OR DELETE ON public.run_holds
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_run_hold_guard();
--> statement-breakpoint
CREATE TRIGGER run_holds_write_guard BEFORE INSERT ON public.run_holds
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_run_write_guard('opened_by');
--> statement-breakpoint
CREATE TRIGGER run_holds_signed_guard BEFORE INSERT OR UPDATE OR DELETE ON public.run_holds
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_signed_run_change();
--> statement-breakpoint
REVOKE DELETE, TRUNCATE ON public.run_holds FROM benchwright_app;
--> statement-breakpoint
-- At commit: a hold decided "abandon" leaves its run closed as abandoned.
CREATE FUNCTION public.benchwright_require_abandoned_run() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  IF NOT EXISTS (SELECT 1 FROM public.runs WHERE id = NEW.run_id AND status = 'abandoned') THEN
    RAISE EXCEPTION 'hold %: decided to abandon, but bench run % is not closed as abandoned', NEW.id, NEW.run_id
      USING ERRCODE = 'integrity_constraint_violation';
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE CONSTRAINT TRIGGER run_holds_abandoned AFTER UPDATE ON public.run_holds
  DEFERRABLE INITIALLY DEFERRED
  FOR EACH ROW WHEN (NEW.decision = 'abandon')
  EXECUTE FUNCTION public.benchwright_require_abandoned_run();
--> statement-breakpoint
-- A step exception is recorded by the run's performer on a step of the run that is not a hazard
-- note, undecided; only a deviation is decided, once, by a senior who neither recorded it nor
-- performs the run, at the database's time; none is deleted.
CREATE FUNCTION public.benchwright_step_exception_guard() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'step record % is part of the run''s record and cannot be deleted', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  SELECT status, performed_by, steps INTO r FROM public.runs WHERE id = NEW.run_id;
  IF TG_OP = 'INSERT' THEN
    IF NEW.decision IS NOT NULL THEN
      RAISE EXCEPTION 'a step record is written undecided' USING ERRCODE = 'check_violation';
    END IF;
    IF NOT EXISTS (SELECT 1 FROM jsonb_array_elements(r.steps) s
                    WHERE s ->> 'id' = NEW.step_id AND s ->> 'kind' IN ('reading', 'check')) THEN
      RAISE EXCEPTION 'bench run % has no reading or check step %', NEW.run_id, NEW.step_id USING ERRCODE = 'check_violation';
    END IF;
    RETURN NEW;
  END IF;
  IF OLD.decision IS NOT NULL THEN
    RAISE EXCEPTION 'step record % was decided and cannot be changed', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF OLD.kind <> 'deviation' THEN
    RAISE EXCEPTION 'step record % is not a deviation; it takes no decision', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF (NEW.id, NEW.run_id, NEW.step_id, NEW.kind, NEW.reason, NEW.recorded_by, NEW.recorded_by_name, NEW.recorded_at)
     IS DISTINCT FROM (OLD.id, OLD.run_id, OLD.step_id, OLD.kind, OLD.reason, OLD.recorded_by, OLD.recorded_by_name, OLD.recorded_at) THEN
    RAISE EXCEPTION 'step record %: only its decision is written', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF r.status IS DISTINCT FROM 'in_progress' THEN
    RAISE EXCEPTION 'bench run % is not open; its deviation cannot be decided', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  IF NOT public.benchwright_is_senior(NEW.decided_by) THEN
    RAISE EXCEPTION 'deviation %: only an active reviewer or admin decides', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.decided_by = r.performed_by OR NEW.decided_by = OLD.recorded_by THEN
    RAISE EXCEPTION 'deviation %: the technician on the run does not decide it', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  NEW.decided_at := now();
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER run_step_exceptions_guard BEFORE INSERT OR UPDATE OR DELETE ON public.run_step_exceptions
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_step_exception_guard();
--> statement-breakpoint
CREATE TRIGGER run_step_exceptions_write_guard BEFORE INSERT ON public.run_step_exceptions
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_run_write_guard('recorded_by');
--> statement-breakpoint
CREATE TRIGGER run_step_exceptions_signed_guard BEFORE INSERT OR UPDATE OR DELETE ON public.run_step_exceptions
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_signed_run_change();
--> statement-breakpoint
REVOKE DELETE, TRUNCATE ON public.run_step_exceptions FROM benchwright_app;
