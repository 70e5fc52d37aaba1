// One imported row judged by the same rules and engine as a check from the form or the API: instrument and
// status, plan, time (not in the future), readings against d, weight suitability, the named operator's training.
import { CHECK_TYPES, type CheckType, type MassUnit } from "../../db/schema/enums";
import { evaluateCheck, type CheckEvaluation } from "../lib/check-evaluation";
import { parseReadings, type EccentricityPosition } from "../lib/check-readings";
import { FIELD_LABELS, SITE_ZONE, type ImportField, type ImportSettings } from "../lib/csv-mapping";
import { readingsInput, rowUnit, splitReadings } from "../lib/csv-readings";
import { rawText, type RowProblem, type RowValues } from "../lib/csv-row";
import { parseCheckTime } from "../lib/csv-time";
import { dedupeKey } from "./checks.server";
import { ImportContext } from "./imports-context.server";

export interface StagedRow {
  line: number;
  instrumentId: number;
  siteId: number;
  /** The instrument's status when the row was judged; the import stops if it changes before the insert. */
  instrumentStatus: string;
  checkType: CheckType;
  planId: number;
  weightId: number | null;
  operatorId: number;
  operatorNamed: boolean;
  performedAt: Date;
  unit: MassUnit;
  evaluation: CheckEvaluation;
  dedupeKey: string;
  note: string;
  readings: string[];
  positions: (EccentricityPosition | null)[];
}

export interface ValidationEnv {
  settings: ImportSettings;
  /** The column label each field was mapped from (readings: the first readings column). */
  columns: Partial<Record<ImportField, string>>;
  importerId: number;
  now: Date;
}

function readingPlace(pointer: string): string {
  const m = /^\/readings\/(.+)$/.exec(pointer);
  if (!m) return "";
  return /^\d+$/.test(m[1]) ? `Reading ${Number(m[1]) + 1}: ` : `${m[1]}: `;
}

export function validateRow(row: { line: number; values: RowValues; readingCells: string[]; fields: string[] }, ctx: ImportContext, env: ValidationEnv): StagedRow | RowProblem[] {
  const { values, line } = row;
  const problems: RowProblem[] = [];
  const problem = (field: ImportField | null, reason: string) => problems.push({ line, column: field ? env.columns[field] ?? FIELD_LABELS[field] : null, reason, raw: rawText(row.fields, env.settings.delimiter) });

  const typeText = (values.check_type ?? "").toLowerCase();
  const type = CHECK_TYPES.find((t) => t === typeText);
  if (!type) problem("check_type", `"${values.check_type}" is not a check type; use ${CHECK_TYPES.join(", ")}.`);
  const tag = values.asset_tag ?? "";
  const instrument = ctx.instruments.get(tag) ?? null;
  if (!instrument) problem("asset_tag", `No instrument with asset tag "${tag}" is visible to you.`);
  else if (instrument.refusal) problem("asset_tag", instrument.refusal);
  const email = values.operator_email?.toLowerCase();
  const operator = email ? ctx.operators.get(email) ?? null : null;
  if (email && !operator) problem("operator_email", `No person with the e-mail ${values.operator_email} is registered in Tareline.`);
  const zone = env.settings.timeZone === SITE_ZONE ? instrument?.timeZone ?? "UTC" : env.settings.timeZone;
  const time = parseCheckTime(values.performed_at ?? "", zone, env.now);
  if (!time.ok) problem("performed_at", time.message);
  if (problems.length || !type || !instrument || !time.ok) return problems;

  const performedAt = time.at;
  const checkDate = performedAt.toISOString().slice(0, 10);
  if (instrument.outOfServiceSince && performedAt > instrument.outOfServiceSince) {
    problem("performed_at", `${tag} has been out of service since ${instrument.outOfServiceSince.toISOString()}; later checks cannot be imported until a metrologist releases it.`);
  }
  const plan = ctx.plans.get(ImportContext.planKey(instrument.row.id, type)) ?? null;
  if (!plan) problem("check_type", `${tag} has no ${type} check plan; a metrologist must set its requirement first.`);

  const pieces = splitReadings(row.readingCells);
  const unit = rowUnit(values.unit, pieces, env.settings.unit);
  if (!unit.ok) problem(values.unit ? "unit" : "readings", unit.message);
  const input = readingsInput(type, pieces);
  if (!input.ok) problem("readings", input.message);
  const parsed = unit.ok && input.ok ? parseReadings(input.value, { type, unit: unit.unit, readabilityG: instrument.row.readabilityG }) : null;
  if (parsed && !parsed.ok) for (const p of parsed.problems) problem("readings", `${readingPlace(p.pointer)}${p.message}`);

  const named = values.weight ? ctx.weights.get(values.weight) ?? null : null;
  if (values.weight && (!named || named.row.siteId !== instrument.row.siteId)) problem("weight", `No test weight "${values.weight}" is registered at ${instrument.siteCode}.`);
  const weight = values.weight ? named : type === "repeatability" ? null : plan?.defaultWeight ?? null;
  if (operator && !ctx.isTrained(operator, type, checkDate)) {
    problem("operator_email", `${values.operator_email} has no valid training record for the ${type} check procedure on ${checkDate}.`);
  }
  if (problems.length || !plan || !parsed?.ok || !unit.ok) return problems;

  const judged = evaluateCheck({ type, instrument: instrument.spec, requirement: plan.requirement, weight: weight?.spec ?? null, readings: parsed.readings, checkDate });
  if (!judged.ok) {
    for (const message of judged.problems) problem(/weight/i.test(message) ? "weight" : null, message);
    return problems;
  }
  const entered = parsed.readings.map((r) => r.entered);
  return {
    line,
    instrumentId: instrument.row.id,
    siteId: instrument.row.siteId,
    instrumentStatus: instrument.row.status,
    checkType: type,
    planId: plan.plan.id,
    weightId: weight?.row.id ?? null,
    operatorId: operator?.id ?? env.importerId,
    operatorNamed: Boolean(operator),
    performedAt,
    unit: unit.unit,
    evaluation: judged.evaluation,
    dedupeKey: dedupeKey(instrument.row.id, type, performedAt, unit.unit, entered),
    note: values.note ?? "",
    readings: entered,
    positions: parsed.readings.map((r) => r.position),
  };
}
