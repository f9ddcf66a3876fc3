-- Attachments are content-addressed: the bytes live in the file store under their SHA-256
-- (server/storage), so the row needs no stored name and can name only one content. Files kept
-- under the older random names are moved to their SHA-256 names by the server at start-up.
ALTER TABLE "attachments" DROP CONSTRAINT "attachments_storedName_unique";--> statement-breakpoint
ALTER TABLE "attachments" DROP COLUMN "stored_name";--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_sha256_hex" CHECK ("attachments"."sha256" ~ '^[0-9a-f]{64}$');--> statement-breakpoint
-- Who may read an attachment is asked by its id: is it a run or unit photo?
CREATE INDEX "run_photos_attachment_idx" ON "run_photos" USING btree ("attachment_id");--> statement-breakpoint
CREATE INDEX "unit_photos_attachment_idx" ON "unit_photos" USING btree ("attachment_id");--> statement-breakpoint
-- Append-only, whoever connects: a signed revision's image cannot be re-pointed or removed.
CREATE OR REPLACE FUNCTION public.benchwright_refuse_attachment_change() RETURNS trigger
  LANGUAGE plpgsql
  SET search_path = pg_catalog, public, pg_temp
AS $$
BEGIN
  RAISE EXCEPTION 'attachments are append-only: % refused', TG_OP USING ERRCODE = 'check_violation';
END;
$$;--> statement-breakpoint
CREATE TRIGGER attachments_append_only BEFORE UPDATE OR DELETE ON "attachments"
  FOR EACH ROW EXECUTE FUNCTION public.benchwright_refuse_attachment_change();--> statement-breakpoint
CREATE TRIGGER attachments_no_truncate BEFORE TRUNCATE ON "attachments"
  FOR EACH STATEMENT EXECUTE FUNCTION public.benchwright_refuse_attachment_change();--> statement-breakpoint
-- And the application role may only read and add (drizzle/0013_app_role.sql).
REVOKE UPDATE, DELETE, TRUNCATE ON "attachments" FROM benchwright_app;
