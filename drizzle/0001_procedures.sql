CREATE TABLE "attachments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"stored_name" text NOT NULL,
	"original_name" text NOT NULL,
	"media_type" text NOT NULL,
	"size" bigint NOT NULL,
	"sha256" text NOT NULL,
	"uploaded_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "attachments_storedName_unique" UNIQUE("stored_name")
);
--> statement-breakpoint
CREATE TABLE "procedures" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"title" text NOT NULL,
	"equipment_family" text NOT NULL,
	"equipment_model" text NOT NULL,
	"tags" text[] DEFAULT '{}'::text[] NOT NULL,
	"owner_id" uuid NOT NULL,
	"seed_key" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "procedures_seedKey_unique" UNIQUE("seed_key")
);
--> statement-breakpoint
CREATE TABLE "revisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"procedure_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"state" text DEFAULT 'draft' NOT NULL,
	"title" text NOT NULL,
	"equipment_family" text NOT NULL,
	"equipment_model" text NOT NULL,
	"tags" text[] DEFAULT '{}'::text[] NOT NULL,
	"document" jsonb NOT NULL,
	"params" jsonb NOT NULL,
	"snapshot" jsonb NOT NULL,
	"html" text NOT NULL,
	"plain_text" text NOT NULL,
	"author_id" uuid NOT NULL,
	"editor_ids" uuid[] DEFAULT '{}'::uuid[] NOT NULL,
	"lock_version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"submitted_at" timestamp with time zone,
	"decided_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_uploaded_by_people_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "procedures" ADD CONSTRAINT "procedures_owner_id_people_id_fk" FOREIGN KEY ("owner_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revisions" ADD CONSTRAINT "revisions_procedure_id_procedures_id_fk" FOREIGN KEY ("procedure_id") REFERENCES "public"."procedures"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revisions" ADD CONSTRAINT "revisions_author_id_people_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "procedures_family_idx" ON "procedures" USING btree ("equipment_family");--> statement-breakpoint
CREATE UNIQUE INDEX "revisions_procedure_number_uq" ON "revisions" USING btree ("procedure_id","number");--> statement-breakpoint
CREATE UNIQUE INDEX "revisions_one_open_uq" ON "revisions" USING btree ("procedure_id") WHERE state in ('draft', 'in_review');--> statement-breakpoint
CREATE UNIQUE INDEX "revisions_one_approved_uq" ON "revisions" USING btree ("procedure_id") WHERE state = 'approved';--> statement-breakpoint
CREATE INDEX "revisions_state_idx" ON "revisions" USING btree ("state");