// The bulk path: accepted rows stream through COPY into a TEMP table of the import's own transaction, then
// duplicates are found and checks and readings inserted with a handful of set-based statements.
import { sql } from "drizzle-orm";
import type { Transaction } from "../lib/db.server";
import type { StagedRow } from "./imports-validate.server";

export const CREATE_STAGE = sql.raw(`
  CREATE TEMP TABLE import_stage (
    line integer NOT NULL,
    instrument_id integer NOT NULL,
    check_type check_type NOT NULL,
    plan_id integer NOT NULL,
    weight_id integer,
    operator_id integer NOT NULL,
    performed_at timestamptz NOT NULL,
    unit mass_unit NOT NULL,
    result_g double precision NOT NULL,
    expanded_uncertainty_g double precision,
    tolerance_g double precision NOT NULL,
    acceptance_g double precision NOT NULL,
    outcome outcome NOT NULL,
    basis text NOT NULL,
    details jsonb,
    dedupe_key text NOT NULL,
    note text NOT NULL,
    readings numeric[] NOT NULL,
    positions eccentricity_position[]
  ) ON COMMIT DROP`);

export const COPY_STAGE =
  "COPY import_stage (line, instrument_id, check_type, plan_id, weight_id, operator_id, performed_at, unit, result_g, expanded_uncertainty_g, tolerance_g, acceptance_g, outcome, basis, details, dedupe_key, note, readings, positions) FROM STDIN";

/** COPY's text format: backslash, tab and line breaks escaped; \N is NULL. */
function text(value: string): string {
  return /[\\\t\n\r]/.test(value) ? value.replace(/\\/g, "\\\\").replace(/\t/g, "\\t").replace(/\n/g, "\\n").replace(/\r/g, "\\r") : value;
}
const nullable = (value: number | null) => (value === null ? "\\N" : String(value));

export function copyLine(row: StagedRow): string {
  const e = row.evaluation;
  // Appending the flag to the engine's JSON is cheaper than copying the object per row.
  const engine = JSON.stringify(e.details);
  const details = `${engine.length > 2 ? `${engine.slice(0, -1)},` : "{"}"operatorNamed":${row.operatorNamed}}`;
  const positions = row.positions[0] === null ? "\\N" : `{${row.positions.join(",")}}`;
  return [
    row.line,
    row.instrumentId,
    row.checkType,
    row.planId,
    nullable(row.weightId),
    row.operatorId,
    row.performedAt.toISOString(),
    row.unit,
    e.resultG,
    nullable(e.expandedUncertaintyG),
    e.toleranceG,
    e.acceptanceG,
    e.outcome,
    text(e.basis),
    text(details),
    row.dedupeKey,
    text(row.note),
    `{${row.readings.join(",")}}`,
    positions,
  ].join("\t") + "\n";
}

const count = (result: { rowCount: number | null }) => result.rowCount ?? 0;

/** Reports and removes rows that repeat an earlier line of the same file; returns how many. */
export async function rejectInFileDuplicates(tx: Transaction, importId: number): Promise<number> {
  await tx.execute(sql`ANALYZE import_stage`);
  await tx.execute(sql`
    CREATE TEMP TABLE import_stage_repeats ON COMMIT DROP AS
    SELECT s.line, d.first_line FROM import_stage s
    JOIN (SELECT dedupe_key, min(line) AS first_line FROM import_stage GROUP BY dedupe_key HAVING count(*) > 1) d USING (dedupe_key)
    WHERE s.line <> d.first_line`);
  const reported = await tx.execute(sql`
    INSERT INTO import_rows_rejected (import_id, line, "column", reason)
    SELECT ${importId}, line, NULL, 'The same check (instrument, type, time and readings) as line ' || first_line || '; a check is recorded once.'
    FROM import_stage_repeats`);
  await tx.execute(sql`DELETE FROM import_stage s USING import_stage_repeats r WHERE s.line = r.line`);
  return count(reported);
}

/** Reports and removes rows already recorded (a re-import): they are duplicates, not errors. */
export async function setAsideRecorded(tx: Transaction, importId: number): Promise<number> {
  const reported = await tx.execute(sql`
    INSERT INTO import_rows_rejected (import_id, line, "column", reason)
    SELECT ${importId}, s.line, NULL, 'Already recorded as check ' || c.id || '; not imported again.'
    FROM import_stage s JOIN checks c ON c.dedupe_key = s.dedupe_key`);
  if (count(reported)) await tx.execute(sql`DELETE FROM import_stage s USING checks c WHERE c.dedupe_key = s.dedupe_key`);
  return count(reported);
}

/** Inserts the staged checks and their readings in two statements; a row that raced in meanwhile is skipped. */
export async function insertStaged(tx: Transaction, importId: number): Promise<number> {
  const result = await tx.execute<{ checks: number }>(sql`
    WITH inserted AS (
      INSERT INTO checks (instrument_id, check_type, plan_id, weight_id, operator_id, performed_at, unit, result_g, expanded_uncertainty_g,
                          tolerance_g, acceptance_g, outcome, basis, details, source, dedupe_key, import_id, note, readings_entered)
      SELECT instrument_id, check_type, plan_id, weight_id, operator_id, performed_at, unit, result_g, expanded_uncertainty_g,
             tolerance_g, acceptance_g, outcome, basis, details, 'import', dedupe_key, ${importId}, note, readings_as_entered(readings, positions::text[])
      FROM import_stage
      ORDER BY instrument_id, check_type, performed_at
      ON CONFLICT (dedupe_key) DO NOTHING
      RETURNING id, dedupe_key
    ), readings AS (
      INSERT INTO check_readings (check_id, ordinal, position, value)
      SELECT i.id, r.ordinal, r.position, r.value
      FROM inserted i JOIN import_stage s ON s.dedupe_key = i.dedupe_key
      CROSS JOIN LATERAL unnest(s.readings, s.positions) WITH ORDINALITY AS r(value, position, ordinal)
    )
    SELECT count(*)::int AS checks FROM inserted`);
  return result.rows[0]?.checks ?? 0;
}

/** The instrument × check-type series the staged rows belong to. */
export async function stagedSeries(tx: Transaction) {
  const result = await tx.execute<{ instrument_id: number; check_type: StagedRow["checkType"] }>(sql`SELECT DISTINCT instrument_id, check_type FROM import_stage`);
  return result.rows.map((r) => ({ instrumentId: r.instrument_id, type: r.check_type }));
}
