ALTER TABLE "checks" ADD COLUMN "readings_entered" text;--> statement-breakpoint
-- The one definition of the readings' text: the export and the checks table show it, every insert path calls it.
CREATE OR REPLACE FUNCTION readings_as_entered(vals numeric[], positions text[]) RETURNS text
LANGUAGE sql IMMUTABLE PARALLEL SAFE AS $$
  SELECT string_agg(coalesce(p || '=', '') || v::text, ' ' ORDER BY o) FROM unnest(vals, positions) WITH ORDINALITY AS x(v, p, o)
$$;
--> statement-breakpoint
ALTER TABLE checks DISABLE TRIGGER checks_keep_original;
--> statement-breakpoint
UPDATE checks c SET readings_entered = r.text
FROM (SELECT check_id, readings_as_entered(array_agg(value ORDER BY ordinal), array_agg(position::text ORDER BY ordinal)) AS text FROM check_readings GROUP BY check_id) r
WHERE r.check_id = c.id;
--> statement-breakpoint
ALTER TABLE checks ENABLE TRIGGER checks_keep_original;
--> statement-breakpoint
-- The copy is part of the record: like the readings themselves it is never changed after the check is written.
CREATE OR REPLACE FUNCTION checks_keep_original() RETURNS trigger AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'a recorded check is never deleted: record a correction instead' USING ERRCODE = 'insufficient_privilege';
  END IF;
  IF (NEW.instrument_id, NEW.check_type, NEW.plan_id, NEW.weight_id, NEW.operator_id, NEW.performed_at, NEW.recorded_at, NEW.unit,
      NEW.result_g, NEW.expanded_uncertainty_g, NEW.tolerance_g, NEW.acceptance_g, NEW.outcome, NEW.basis, NEW.details, NEW.source,
      NEW.note, NEW.corrects_check_id, NEW.correction_reason, NEW.readings_entered)
     IS DISTINCT FROM
     (OLD.instrument_id, OLD.check_type, OLD.plan_id, OLD.weight_id, OLD.operator_id, OLD.performed_at, OLD.recorded_at, OLD.unit,
      OLD.result_g, OLD.expanded_uncertainty_g, OLD.tolerance_g, OLD.acceptance_g, OLD.outcome, OLD.basis, OLD.details, OLD.source,
      OLD.note, OLD.corrects_check_id, OLD.correction_reason, OLD.readings_entered)
     OR (OLD.superseded_at IS NOT NULL AND NEW.superseded_at IS DISTINCT FROM OLD.superseded_at) THEN
    RAISE EXCEPTION 'a recorded check is never overwritten: record a correction instead' USING ERRCODE = 'insufficient_privilege';
  END IF;
  RETURN NEW;
END;
$$ LANGUAGE plpgsql;
