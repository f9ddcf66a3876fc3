-- Accounts: authenticator secrets (RFC 6238) on people, hashed single-use recovery codes, the shop's
-- one-row sign-in settings, and the purpose of a set-password link (invitation or admin-started reset).
CREATE TABLE "recovery_codes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"person_id" uuid NOT NULL,
	"code_hash" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"used_at" timestamp with time zone,
	CONSTRAINT "recovery_codes_person_code" UNIQUE("person_id","code_hash")
);
--> statement-breakpoint
CREATE TABLE "shop_settings" (
	"id" boolean PRIMARY KEY DEFAULT true NOT NULL,
	"require_second_factor" boolean DEFAULT false NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_by" uuid,
	CONSTRAINT "shop_settings_one_row" CHECK ("shop_settings"."id")
);
--> statement-breakpoint
ALTER TABLE "invitations" ADD COLUMN "purpose" text DEFAULT 'invitation' NOT NULL;--> statement-breakpoint
ALTER TABLE "people" ADD COLUMN "totp_secret" text;--> statement-breakpoint
ALTER TABLE "people" ADD COLUMN "totp_pending_secret" text;--> statement-breakpoint
ALTER TABLE "people" ADD COLUMN "totp_last_step" bigint;--> statement-breakpoint
ALTER TABLE "recovery_codes" ADD CONSTRAINT "recovery_codes_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD CONSTRAINT "shop_settings_updated_by_people_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
INSERT INTO "shop_settings" ("id") VALUES (true) ON CONFLICT DO NOTHING;