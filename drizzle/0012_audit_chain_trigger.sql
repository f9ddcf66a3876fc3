-- A hash chain over the audit log: each row carries its position (seq), the SHA-256 of the row
-- before it and its own SHA-256 over its content and that link. Rows are chained under an
-- advisory lock, so concurrent writers queue and the chain never forks. The checker
-- (server/audit/chain.ts) recomputes every hash outside the database and names the first row
-- whose content or link does not match, or where a row is missing.
--
-- The hashed text: the fields below joined by the unit separator (U+001F), NULL written as \N.
CREATE OR REPLACE FUNCTION benchwright_audit_text(a audit_log) RETURNS text AS $$
  SELECT concat_ws(chr(31),
    a.seq::text,
    a.id::text,
    to_char(a.at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"'),
    COALESCE(a.actor_id::text, '\N'),
    a.action,
    COALESCE(a.subject, '\N'),
    a.details::text,
    COALESCE(a.ip, '\N'),
    a.prev_hash)
$$ LANGUAGE sql IMMUTABLE;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION benchwright_chain_audit() RETURNS trigger AS $$
DECLARE
  last record;
BEGIN
  PERFORM pg_advisory_xact_lock(hashtext('benchwright_audit_chain'));
  SELECT seq, row_hash INTO last FROM audit_log WHERE seq IS NOT NULL ORDER BY seq DESC LIMIT 1;
  NEW.seq := COALESCE(last.seq, 0) + 1;
  NEW.prev_hash := COALESCE(last.row_hash, repeat('0', 64));
  NEW.row_hash := encode(sha256(convert_to(benchwright_audit_text(NEW), 'UTF8')), 'hex');
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
-- Rows written before the chain existed are chained once, in the order they were written.
ALTER TABLE audit_log DISABLE TRIGGER audit_log_append_only;
--> statement-breakpoint
DO $$
DECLARE
  r audit_log;
  prev text := repeat('0', 64);
  n bigint := 0;
BEGIN
  FOR r IN SELECT * FROM audit_log ORDER BY id LOOP
    n := n + 1;
    r.seq := n;
    r.prev_hash := prev;
    r.row_hash := encode(sha256(convert_to(benchwright_audit_text(r), 'UTF8')), 'hex');
    UPDATE audit_log SET seq = r.seq, prev_hash = r.prev_hash, row_hash = r.row_hash WHERE id = r.id;
    prev := r.row_hash;
  END LOOP;
END;
$$;
--> statement-breakpoint
ALTER TABLE audit_log ENABLE TRIGGER audit_log_append_only;
--> statement-breakpoint
ALTER TABLE audit_log ALTER COLUMN seq SET NOT NULL, ALTER COLUMN prev_hash SET NOT NULL, ALTER COLUMN row_hash SET NOT NULL;
--> statement-breakpoint
CREATE TRIGGER audit_log_chain BEFORE INSERT ON audit_log FOR EACH ROW EXECUTE FUNCTION benchwright_chain_audit();
