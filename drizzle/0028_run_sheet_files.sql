CREATE TABLE "run_sheet_files" (
	"sheet_key" text PRIMARY KEY NOT NULL,
	"run_id" uuid NOT NULL,
	"sha256" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "run_sheet_files_sha256_hex" CHECK ("run_sheet_files"."sha256" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
ALTER TABLE "run_sheet_files" ADD CONSTRAINT "run_sheet_files_run_id_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."runs"("id") ON DELETE no action ON UPDATE no action;