-- Password tries per key, shared by every app process (server/auth/throttle.ts). An ordinary table:
-- the app role claims, releases and prunes rows.
CREATE TABLE "auth_throttle" (
	"key" text PRIMARY KEY NOT NULL,
	"failures" integer NOT NULL,
	"retry_at" timestamp with time zone NOT NULL,
	"forget_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE INDEX "auth_throttle_forget_idx" ON "auth_throttle" USING btree ("forget_at");