ALTER TABLE "revisions" ADD COLUMN "provenance_ids" uuid[] DEFAULT '{}'::uuid[] NOT NULL;
