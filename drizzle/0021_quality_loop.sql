CREATE TABLE "review_due_notices" (
	"revision_id" uuid PRIMARY KEY NOT NULL,
	"due_at" timestamp with time zone NOT NULL,
	"notified_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "revision_acknowledgements" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"procedure_id" uuid NOT NULL,
	"revision_number" integer NOT NULL,
	"person_id" uuid NOT NULL,
	"person_name" text NOT NULL,
	"content_hash" text NOT NULL,
	"acknowledged_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "revisions" ADD COLUMN "change_reason" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "review_due_notices" ADD CONSTRAINT "review_due_notices_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_acknowledgements" ADD CONSTRAINT "revision_acknowledgements_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_acknowledgements" ADD CONSTRAINT "revision_acknowledgements_procedure_id_procedures_id_fk" FOREIGN KEY ("procedure_id") REFERENCES "public"."procedures"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_acknowledgements" ADD CONSTRAINT "revision_acknowledgements_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "revision_acknowledgements_revision_person_uq" ON "revision_acknowledgements" USING btree ("revision_id","person_id");--> statement-breakpoint
CREATE INDEX "revision_acknowledgements_person_idx" ON "revision_acknowledgements" USING btree ("person_id");--> statement-breakpoint
-- hand-written
-- A revision's change reason: given as it goes to review (never blank there), fixed from then on.
CREATE FUNCTION public.benchwright_guard_change_reason() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
BEGIN
  IF NEW.change_reason IS DISTINCT FROM OLD.change_reason AND OLD.state <> 'draft' THEN
    RAISE EXCEPTION 'revision % is %: its change reason was given at submission and cannot change', OLD.id, OLD.state USING ERRCODE = 'check_violation';
  END IF;
  IF OLD.state = 'draft' AND NEW.state = 'in_review' AND btrim(NEW.change_reason) = '' THEN
    RAISE EXCEPTION 'revision % cannot go to review without a change reason', OLD.id USING ERRCODE = 'check_violation';
  END IF;
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER revisions_change_reason_guard BEFORE UPDATE ON public.revisions
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_guard_change_reason();
--> statement-breakpoint
-- An acknowledgement names an approved revision and the content hash its approval signed, by an
-- active person; its time is the database clock's. Once written it is never changed or removed.
CREATE FUNCTION public.benchwright_guard_acknowledgement() RETURNS trigger
  LANGUAGE plpgsql SET search_path = pg_catalog, public, pg_temp AS $$
DECLARE
  r record;
BEGIN
  SELECT id, procedure_id, number, state, content_hash INTO r FROM public.revisions WHERE id = NEW.revision_id;
  IF NOT FOUND OR r.state <> 'approved' THEN
    RAISE EXCEPTION 'only an approved revision can be acknowledged (revision % is %)', NEW.revision_id, COALESCE(r.state, 'missing')
      USING ERRCODE = 'check_violation';
  END IF;
  IF NEW.content_hash IS DISTINCT FROM r.content_hash OR NEW.procedure_id IS DISTINCT FROM r.procedure_id
     OR NEW.revision_number IS DISTINCT FROM r.number THEN
    RAISE EXCEPTION 'acknowledgement of revision % does not match it: hash %, the revision records %', NEW.revision_id, NEW.content_hash, r.content_hash
      USING ERRCODE = 'check_violation';
  END IF;
  IF NOT EXISTS (SELECT 1 FROM public.people p WHERE p.id = NEW.person_id AND p.active) THEN
    RAISE EXCEPTION 'acknowledgement by % refused: not an active person', NEW.person_id USING ERRCODE = 'check_violation';
  END IF;
  NEW.acknowledged_at := clock_timestamp();
  RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER revision_acknowledgements_guard BEFORE INSERT ON public.revision_acknowledgements
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_guard_acknowledgement();
--> statement-breakpoint
CREATE TRIGGER revision_acknowledgements_append_only BEFORE UPDATE OR DELETE ON public.revision_acknowledgements
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_append_only_change();
--> statement-breakpoint
REVOKE UPDATE, DELETE, TRUNCATE ON public.revision_acknowledgements FROM benchwright_app;
--> statement-breakpoint
CREATE TRIGGER revision_acknowledgements_no_truncate BEFORE TRUNCATE ON public.revision_acknowledgements
  FOR EACH STATEMENT EXECUTE FUNCTION public.benchwright_refuse_append_only_change();
