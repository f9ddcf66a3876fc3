ALTER TABLE "run_entries" ADD COLUMN "taken_on" date;--> statement-breakpoint
ALTER TABLE "run_entry_history" ADD COLUMN "taken_on" date;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "paper_sheet_date" date;--> statement-breakpoint
ALTER TABLE "runs" ADD COLUMN "paper_sheet_ref" text;--> statement-breakpoint
-- hand-written
-- A paper bench sheet's date is set only while the run is in progress, and is neither later than today
-- nor earlier than the day the revision it follows was approved. A sheet's date is the shop's calendar
-- date: "today" is taken where the date is latest (UTC+14) and the approval day where it is earliest
-- (UTC-12), so no shop's real date is refused (the server checks the same, server/modules/paper-sheets).
CREATE FUNCTION public.benchwright_paper_sheet_guard() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  approved timestamptz;
BEGIN
  IF TG_OP = 'UPDATE' THEN
    IF NEW.paper_sheet_date IS NOT DISTINCT FROM OLD.paper_sheet_date
       AND NEW.paper_sheet_ref IS NOT DISTINCT FROM OLD.paper_sheet_ref THEN
      RETURN NEW;
    END IF;
    IF OLD.status IS DISTINCT FROM 'in_progress' THEN
      RAISE EXCEPTION 'bench run % is closed: its paper sheet cannot be changed', OLD.id USING ERRCODE = 'check_violation';
    END IF;
  END IF;
  IF NEW.paper_sheet_date IS NULL THEN
    IF NEW.paper_sheet_ref IS NOT NULL THEN
      RAISE EXCEPTION 'a paper sheet identifier needs the sheet''s date' USING ERRCODE = 'check_violation';
    END IF;
    RETURN NEW;
  END IF;
  IF NEW.paper_sheet_date > (now() AT TIME ZONE 'Etc/GMT-14')::date THEN
    RAISE EXCEPTION 'paper sheet date % is in the future', NEW.paper_sheet_date USING ERRCODE = 'check_violation';
  END IF;
  SELECT decided_at INTO approved FROM public.revisions WHERE id = NEW.revision_id AND state IN ('approved', 'superseded', 'withdrawn');
  IF approved IS NULL OR NEW.paper_sheet_date < (approved AT TIME ZONE 'Etc/GMT+12')::date THEN
    RAISE EXCEPTION 'paper sheet date % is before revision % was approved', NEW.paper_sheet_date, NEW.revision_id USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER runs_paper_sheet_guard BEFORE INSERT OR UPDATE OF paper_sheet_date, paper_sheet_ref ON public.runs
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_paper_sheet_guard();
--> statement-breakpoint
-- An entry (and each version of it) copied from paper carries exactly the run's paper sheet date.
CREATE FUNCTION public.benchwright_entry_taken_on_guard() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  paper date;
BEGIN
  IF NEW.taken_on IS NULL THEN RETURN NEW; END IF;
  SELECT paper_sheet_date INTO paper FROM public.runs WHERE id = NEW.run_id;
  IF paper IS DISTINCT FROM NEW.taken_on THEN
    RAISE EXCEPTION 'an entry of bench run % is dated % but the run''s paper sheet is dated %', NEW.run_id, NEW.taken_on, COALESCE(paper::text, 'none')
      USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER run_entries_taken_on_guard BEFORE INSERT OR UPDATE OF taken_on ON public.run_entries
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_entry_taken_on_guard();
--> statement-breakpoint
CREATE TRIGGER run_entry_history_taken_on_guard BEFORE INSERT ON public.run_entry_history
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_entry_taken_on_guard();
