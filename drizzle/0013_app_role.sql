-- The application role (server/bootstrap/postgres.ts: APP_ROLE). The app connects as this role,
-- never as the owner: it cannot disable a trigger, alter a table or run superuser-only functions.
-- It reads and writes the ordinary tables; on the append-only records it may only read and add,
-- so the database refuses a change there twice over: no privilege, and the trigger.
-- Tables created by later migrations get the ordinary grants by default; a new append-only
-- table must be added to the REVOKE below in its own migration.
DO $$
BEGIN
  IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname = 'benchwright_app') THEN
    CREATE ROLE benchwright_app NOLOGIN;
  END IF;
END
$$;
--> statement-breakpoint
GRANT USAGE ON SCHEMA public TO benchwright_app;
--> statement-breakpoint
GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO benchwright_app;
--> statement-breakpoint
GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO benchwright_app;
--> statement-breakpoint
REVOKE UPDATE, DELETE, TRUNCATE ON signatures, run_signatures, run_entry_history, review_comments, audit_log FROM benchwright_app;
--> statement-breakpoint
ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO benchwright_app;
--> statement-breakpoint
ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT USAGE, SELECT ON SEQUENCES TO benchwright_app;
