-- Keeps procedure_listing in step with revisions, inside the same transaction as the change:
-- per procedure, the newest revision staff may see (any state) and the newest one technicians may
-- see (approved or superseded), with the approved revision when there is one.
CREATE OR REPLACE FUNCTION benchwright_refresh_listing(pid uuid) RETURNS void AS $$
BEGIN
  -- One refresh per procedure at a time. Under READ COMMITTED each statement below then starts
  -- after the other transaction's commit and sees its change; without the lock, an upsert that
  -- waited on the other's row lock would write what it read before (a withdrawn revision shown
  -- as approved, say).
  PERFORM pg_advisory_xact_lock(hashtext('benchwright_listing'), hashtext(pid::text));
  INSERT INTO procedure_listing AS l
    (procedure_id, audience, revision_id, number, state, title, equipment_family, equipment_model, tags, updated_at, approved_id, approved_number, owner_id)
  SELECT p.id, aud.audience, r.id, r.number, r.state, r.title, r.equipment_family, r.equipment_model, r.tags, r.updated_at, a.id, a.number, p.owner_id
  FROM procedures p
  CROSS JOIN (VALUES ('staff'), ('published')) AS aud(audience)
  JOIN LATERAL (
    SELECT id, number, state, title, equipment_family, equipment_model, tags, updated_at
    FROM revisions
    WHERE procedure_id = p.id AND (aud.audience = 'staff' OR state IN ('approved', 'superseded'))
    ORDER BY number DESC
    LIMIT 1
  ) r ON true
  LEFT JOIN revisions a ON a.procedure_id = p.id AND a.state = 'approved'
  WHERE p.id = pid
  ON CONFLICT (procedure_id, audience) DO UPDATE SET
    revision_id = EXCLUDED.revision_id,
    number = EXCLUDED.number,
    state = EXCLUDED.state,
    title = EXCLUDED.title,
    equipment_family = EXCLUDED.equipment_family,
    equipment_model = EXCLUDED.equipment_model,
    tags = EXCLUDED.tags,
    updated_at = EXCLUDED.updated_at,
    approved_id = EXCLUDED.approved_id,
    approved_number = EXCLUDED.approved_number,
    owner_id = EXCLUDED.owner_id;
  -- An audience with nothing left to see (say, a withdrawn procedure never superseded) loses its row.
  DELETE FROM procedure_listing l
  WHERE l.procedure_id = pid
    AND NOT EXISTS (
      SELECT 1 FROM revisions r
      WHERE r.procedure_id = pid AND (l.audience = 'staff' OR r.state IN ('approved', 'superseded'))
    );
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION benchwright_listing_on_revision() RETURNS trigger AS $$
BEGIN
  PERFORM benchwright_refresh_listing(COALESCE(NEW.procedure_id, OLD.procedure_id));
  RETURN NULL;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER revisions_listing AFTER INSERT OR UPDATE OR DELETE ON revisions
  FOR EACH ROW EXECUTE FUNCTION benchwright_listing_on_revision();
--> statement-breakpoint
CREATE OR REPLACE FUNCTION benchwright_listing_on_owner() RETURNS trigger AS $$
BEGIN
  PERFORM benchwright_refresh_listing(NEW.id);
  RETURN NULL;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER procedures_listing_owner AFTER UPDATE OF owner_id ON procedures
  FOR EACH ROW EXECUTE FUNCTION benchwright_listing_on_owner();
--> statement-breakpoint
SELECT benchwright_refresh_listing(id) FROM procedures;
