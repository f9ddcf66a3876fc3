-- Who performs a bench run now: only they record entries, add photos and sign. A run changes hands
-- only through a recorded handover. Runs from before handovers existed were performed by whoever
-- started them; the backfill passes the signed-run guard once, as the owner, inside this migration.
ALTER TABLE "runs" ADD COLUMN "performed_by" uuid;--> statement-breakpoint
ALTER TABLE "runs" DISABLE TRIGGER USER;--> statement-breakpoint
UPDATE "runs" SET "performed_by" = "started_by";--> statement-breakpoint
ALTER TABLE "runs" ENABLE TRIGGER USER;--> statement-breakpoint
ALTER TABLE "runs" ALTER COLUMN "performed_by" SET NOT NULL;--> statement-breakpoint
CREATE TABLE "run_handovers" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"run_id" uuid NOT NULL,
	"from_id" uuid NOT NULL,
	"from_name" text NOT NULL,
	"to_id" uuid NOT NULL,
	"to_name" text NOT NULL,
	"by_id" uuid NOT NULL,
	"by_name" text NOT NULL,
	"reason" text NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "closed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "closed_by" uuid;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "close_reason" text;--> statement-breakpoint
ALTER TABLE "run_handovers" ADD CONSTRAINT "run_handovers_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_handovers" ADD CONSTRAINT "run_handovers_from_id_people_id_fk" FOREIGN KEY ("from_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_handovers" ADD CONSTRAINT "run_handovers_to_id_people_id_fk" FOREIGN KEY ("to_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "run_handovers" ADD CONSTRAINT "run_handovers_by_id_people_id_fk" FOREIGN KEY ("by_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "run_handovers_run_idx" ON "run_handovers" USING btree ("run_id");--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_performed_by_people_id_fk" FOREIGN KEY ("performed_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_closed_by_people_id_fk" FOREIGN KEY ("closed_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_status_ck" CHECK ("runs"."status" in ('in_progress', 'signed', 'abandoned'));--> statement-breakpoint
ALTER TABLE "runs" ADD CONSTRAINT "runs_abandoned_ck" CHECK ("runs"."status" <> 'abandoned' or ("runs"."closed_at" is not null and "runs"."closed_by" is not null and "runs"."close_reason" is not null));
--> statement-breakpoint
-- Every write on a run (entry, its history, photo, signature, handover) must come from the run's
-- current performer (the column named by the trigger's argument), on a run that is neither closed as
-- abandoned nor on hold because the revision it follows was withdrawn.
CREATE FUNCTION benchwright_run_write_guard() RETURNS trigger
LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
  who uuid := (to_jsonb(NEW) ->> TG_ARGV[0])::uuid;
BEGIN
  SELECT run.status, run.performed_by, rev.state AS revision_state INTO r
    FROM public.runs run JOIN public.revisions rev ON rev.id = run.revision_id
   WHERE run.id = NEW.run_id;
  IF r.status = 'abandoned' THEN
    RAISE EXCEPTION 'bench run % was closed as abandoned and cannot be changed', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  IF r.status = 'in_progress' AND r.revision_state = 'withdrawn' THEN
    RAISE EXCEPTION 'bench run % is on hold: the revision it follows was withdrawn', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  IF who IS DISTINCT FROM r.performed_by THEN
    RAISE EXCEPTION 'bench run % is performed by another technician', NEW.run_id USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER run_entries_write_guard BEFORE INSERT OR UPDATE ON run_entries
  FOR EACH ROW EXECUTE FUNCTION benchwright_run_write_guard('entered_by');
--> statement-breakpoint
CREATE TRIGGER run_entry_history_write_guard BEFORE INSERT ON run_entry_history
  FOR EACH ROW EXECUTE FUNCTION benchwright_run_write_guard('entered_by');
--> statement-breakpoint
CREATE TRIGGER run_photos_write_guard BEFORE INSERT OR UPDATE ON run_photos
  FOR EACH ROW EXECUTE FUNCTION benchwright_run_write_guard('added_by');
--> statement-breakpoint
CREATE TRIGGER run_signatures_write_guard BEFORE INSERT ON run_signatures
  FOR EACH ROW EXECUTE FUNCTION benchwright_run_write_guard('signer_id');
--> statement-breakpoint
CREATE TRIGGER run_handovers_write_guard BEFORE INSERT ON run_handovers
  FOR EACH ROW EXECUTE FUNCTION benchwright_run_write_guard('from_id');
--> statement-breakpoint
CREATE TRIGGER run_handovers_signed_guard BEFORE INSERT ON run_handovers
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_signed_run_change();
--> statement-breakpoint
CREATE TRIGGER run_handovers_append_only BEFORE UPDATE OR DELETE ON run_handovers
  FOR EACH ROW EXECUTE FUNCTION benchwright_refuse_append_only_change();
--> statement-breakpoint
REVOKE UPDATE, DELETE, TRUNCATE ON run_handovers FROM benchwright_app;
--> statement-breakpoint
-- The run row: frozen once abandoned, and its performer changes only with a handover row from the
-- old performer to the new one written in the same transaction (now() is the transaction's start).
CREATE FUNCTION benchwright_run_row_guard() RETURNS trigger
LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  IF OLD.status = 'abandoned' THEN
    RAISE EXCEPTION 'bench run % was closed as abandoned and cannot be changed', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  IF TG_OP = 'UPDATE' AND NEW.performed_by IS DISTINCT FROM OLD.performed_by AND NOT EXISTS (
       SELECT 1 FROM public.run_handovers h
        WHERE h.run_id = NEW.id AND h.from_id = OLD.performed_by AND h.to_id = NEW.performed_by AND h.at = now()) THEN
    RAISE EXCEPTION 'bench run %: a new performer needs a handover recorded in the same transaction', NEW.id USING ERRCODE = 'check_violation';
  END IF;
  IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER runs_custody_guard BEFORE UPDATE OR DELETE ON runs
  FOR EACH ROW EXECUTE FUNCTION benchwright_run_row_guard();
