ALTER TABLE "revisions" ADD COLUMN "provenance_ids" uuid[] DEFAULT '{}'::uuid[] NOT NULL;
--> statement-breakpoint
ALTER TABLE "run_entry_history" ADD COLUMN "request_hash" text;
