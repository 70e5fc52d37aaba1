-- The audit trail is a hash chain: each event stores the hash of the one before it, so an edit made behind the
-- application's back (with the append-only trigger disabled) breaks a link that `npm run audit:verify` reports.
-- A field is "-" when NULL, else its byte length, ":" and its text, so no two payloads can read the same.
CREATE OR REPLACE FUNCTION audit_events_field(value text) RETURNS text AS $$
  SELECT CASE WHEN value IS NULL THEN '-' ELSE octet_length(value)::text || ':' || value END;
$$ LANGUAGE sql IMMUTABLE;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION audit_events_hash(seq bigint, prev text, at timestamptz, actor integer, action text, entity_type text, entity_id text, site integer, before jsonb, after jsonb) RETURNS text AS $$
  SELECT encode(sha256(convert_to(concat_ws('|',
    audit_events_field(seq::text),
    audit_events_field(prev),
    audit_events_field(to_char(at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')),
    audit_events_field(actor::text),
    audit_events_field(action),
    audit_events_field(entity_type),
    audit_events_field(entity_id),
    audit_events_field(site::text),
    audit_events_field(before::text),
    audit_events_field(after::text)
  ), 'UTF8')), 'hex');
$$ LANGUAGE sql IMMUTABLE;
--> statement-breakpoint
ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_update_delete;
--> statement-breakpoint
DO $$
DECLARE
  r record;
  seq bigint := 0;
  prev text := repeat('0', 64);
  h text;
BEGIN
  FOR r IN SELECT * FROM audit_events ORDER BY id LOOP
    seq := seq + 1;
    h := audit_events_hash(seq, prev, r.at, r.actor_id, r.action, r.entity_type, r.entity_id, r.site_id, r.before, r.after);
    UPDATE audit_events SET chain_seq = seq, prev_hash = prev, hash = h WHERE id = r.id;
    prev := h;
  END LOOP;
END $$;
--> statement-breakpoint
ALTER TABLE audit_events ENABLE TRIGGER audit_events_no_update_delete;
--> statement-breakpoint
-- One writer at a time appends to the chain (the lock is held until the inserting transaction ends), so the next
-- event always sees the committed one before it. Values a client sends for these three columns are overwritten.
CREATE OR REPLACE FUNCTION audit_events_chain() RETURNS trigger AS $$
DECLARE
  last record;
BEGIN
  PERFORM pg_advisory_xact_lock(hashtext('tareline.audit_events.chain'));
  SELECT chain_seq, hash INTO last FROM audit_events WHERE chain_seq IS NOT NULL ORDER BY chain_seq DESC LIMIT 1;
  NEW.chain_seq := coalesce(last.chain_seq, 0) + 1;
  NEW.prev_hash := coalesce(last.hash, repeat('0', 64));
  NEW.hash := audit_events_hash(NEW.chain_seq, NEW.prev_hash, NEW.at, NEW.actor_id, NEW.action, NEW.entity_type, NEW.entity_id, NEW.site_id, NEW.before, NEW.after);
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER audit_events_chain BEFORE INSERT ON audit_events FOR EACH ROW EXECUTE FUNCTION audit_events_chain();
--> statement-breakpoint
-- A recorded check is evidence: a correction is a new row pointing at the original, which keeps its readings and
-- judgement and only gains superseded_at, once. Bookkeeping columns (idempotency, dedupe, import) may still change.
CREATE OR REPLACE FUNCTION checks_keep_original() RETURNS trigger AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'a recorded check is never deleted: record a correction instead' USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF (NEW.instrument_id, NEW.check_type, NEW.plan_id, NEW.weight_id, NEW.operator_id, NEW.performed_at, NEW.recorded_at, NEW.unit,
      NEW.result_g, NEW.expanded_uncertainty_g, NEW.tolerance_g, NEW.acceptance_g, NEW.outcome, NEW.basis, NEW.details, NEW.source,
      NEW.note, NEW.corrects_check_id, NEW.correction_reason)
     IS DISTINCT FROM
     (OLD.instrument_id, OLD.check_type, OLD.plan_id, OLD.weight_id, OLD.operator_id, OLD.performed_at, OLD.recorded_at, OLD.unit,
      OLD.result_g, OLD.expanded_uncertainty_g, OLD.tolerance_g, OLD.acceptance_g, OLD.outcome, OLD.basis, OLD.details, OLD.source,
      OLD.note, OLD.corrects_check_id, OLD.correction_reason)
     OR (OLD.superseded_at IS NOT NULL AND NEW.superseded_at IS DISTINCT FROM OLD.superseded_at) THEN
    RAISE EXCEPTION 'a recorded check is never overwritten: record a correction instead' USING ERRCODE = 'insufficient_privilege';
  END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER checks_keep_original BEFORE UPDATE OR DELETE ON checks FOR EACH ROW EXECUTE FUNCTION checks_keep_original();
--> statement-breakpoint
CREATE OR REPLACE FUNCTION check_readings_keep_original() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION 'check readings are kept as entered: % is not allowed', TG_OP USING ERRCODE = 'insufficient_privilege';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER check_readings_keep_original BEFORE UPDATE OR DELETE ON check_readings FOR EACH ROW EXECUTE FUNCTION check_readings_keep_original();
