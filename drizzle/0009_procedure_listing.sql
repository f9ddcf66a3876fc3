CREATE TABLE "procedure_listing" (
	"procedure_id" uuid NOT NULL,
	"audience" text NOT NULL,
	"revision_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"state" text NOT NULL,
	"title" text NOT NULL,
	"equipment_family" text NOT NULL,
	"equipment_model" text NOT NULL,
	"tags" text[] NOT NULL,
	"updated_at" timestamp with time zone NOT NULL,
	"approved_id" uuid,
	"approved_number" integer,
	"owner_id" uuid NOT NULL,
	CONSTRAINT "procedure_listing_procedure_id_audience_pk" PRIMARY KEY("procedure_id","audience")
);
--> statement-breakpoint
ALTER TABLE "procedure_listing" ADD CONSTRAINT "procedure_listing_procedure_id_procedures_id_fk" FOREIGN KEY ("procedure_id") REFERENCES "public"."procedures"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "procedure_listing_updated_idx" ON "procedure_listing" USING btree ("audience","updated_at","procedure_id");--> statement-breakpoint
CREATE INDEX "procedure_listing_title_idx" ON "procedure_listing" USING btree ("audience",lower("title"),"procedure_id");--> statement-breakpoint
CREATE INDEX "run_entry_history_run_idx" ON "run_entry_history" USING btree ("run_id");