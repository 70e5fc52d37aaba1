// The check export as one query whose rows are already the CSV cells, so PostgreSQL's COPY … TO STDOUT writes the
// file and the app only passes the bytes on: memory stays flat and the app adds next to nothing to the database's
// own speed (docs/decisions/011).
import type { ExportParams } from "../lib/export-params";
import { visibleSiteIds, type Viewer } from "../lib/permissions";

export const EXPORT_HEADER = [
  "check_id", "instrument", "site", "check_type", "performed_at_utc", "performed_at_site", "site_time_zone",
  "result_g", "tolerance_g", "acceptance_g", "outcome", "expanded_uncertainty_g", "readings", "readings_unit",
  "weight", "weight_conventional_mass_g", "operator", "source", "excluded", "note",
];

export interface ExportQuery {
  text: string;
  values: unknown[];
}

/** WHERE clause and values for the viewer's sites and the filters; dates are whole UTC days. */
function filters(viewer: Viewer, params: ExportParams) {
  const values: unknown[] = [];
  const where: string[] = ["c.superseded_at is null"];
  const add = (clause: (n: string) => string, value: unknown) => {
    values.push(value);
    where.push(clause(`$${values.length}`));
  };
  const ids = visibleSiteIds(viewer);
  if (ids !== null) add((n) => `i.site_id = any(${n}::int[])`, ids.length ? ids : [-1]);
  if (params.site) add((n) => `i.site_id = ${n}`, params.site);
  if (params.instrument) add((n) => `i.asset_tag = ${n}`, params.instrument);
  if (params.type) add((n) => `c.check_type = ${n}`, params.type);
  if (params.outcome) add((n) => `c.outcome = ${n}`, params.outcome);
  if (params.from) add((n) => `c.performed_at >= ${n}::date`, params.from);
  if (params.to) add((n) => `c.performed_at < ${n}::date + 1`, params.to);
  if (params.signals) where.push("exists (select 1 from series_summaries ss where ss.instrument_id = c.instrument_id and ss.check_type = c.check_type and jsonb_array_length(ss.active_signals) > 0)");
  return { values, where: where.join(" and ") };
}

const FROM = "from checks c join instruments i on i.id = c.instrument_id join sites s on s.id = i.site_id";

export function exportCountQuery(viewer: Viewer, params: ExportParams): ExportQuery {
  const { values, where } = filters(viewer, params);
  return { text: `select count(*)::int as n ${FROM} where ${where}`, values };
}

/**
 * A text cell a spreadsheet would run as a formula (= + - @, a tab or a carriage return first) gets an apostrophe in
 * front. Only free text goes through it: numbers are written as numbers, so a negative error stays a number.
 */
const neutralised = (expr: string) => `case when ${expr} ~ '^[=+@\\t\\r-]' then '''' || ${expr} else ${expr} end`;

/** The cells in EXPORT_HEADER order. Times are ISO 8601 (UTC with milliseconds, and the site's wall clock). */
const CELLS = [
  "c.id",
  neutralised("i.asset_tag"),
  neutralised("s.code"),
  "c.check_type",
  `to_char(c.performed_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`,
  `to_char(c.performed_at at time zone s.time_zone, 'YYYY-MM-DD"T"HH24:MI:SS')`,
  "s.time_zone",
  "c.result_g",
  "c.tolerance_g",
  "c.acceptance_g",
  "c.outcome",
  "c.expanded_uncertainty_g",
  // The copy kept on the check; a row written before it existed falls back to the readings themselves.
  neutralised("coalesce(c.readings_entered, (select readings_as_entered(array_agg(r.value order by r.ordinal), array_agg(r.position::text order by r.ordinal)) from check_readings r where r.check_id = c.id))"),
  "c.unit",
  neutralised("w.identifier"),
  "w.conventional_mass_g",
  neutralised("u.name"),
  "c.source",
  "case when ex.check_id is null then 'no' else 'yes' end",
  neutralised("nullif(c.note, '')"),
];

export function exportRowsQuery(viewer: Viewer, params: ExportParams): ExportQuery {
  const { values, where } = filters(viewer, params);
  return {
    // Exclusions are few: one hashed set beats a lookup per exported row.
    text: `select ${CELLS.join(", ")}
      ${FROM} join users u on u.id = c.operator_id left join test_weights w on w.id = c.weight_id
      left join (select distinct check_id from point_annotations where excluded and withdrawn_at is null) ex on ex.check_id = c.id
      where ${where} order by c.performed_at, c.id`,
    values,
  };
}

/** COPY takes no parameters, so the values go in as quoted literals (escaped by the driver's own quoting). */
export function exportCopyStatement(viewer: Viewer, params: ExportParams, escapeLiteral: (value: string) => string): string {
  const { text, values } = exportRowsQuery(viewer, params);
  const literal = (v: unknown) => (Array.isArray(v) ? `${escapeLiteral(`{${v.map(Number).join(",")}}`)}` : escapeLiteral(String(v)));
  // One pass over the query's own text: a value is never scanned again, so a "$1" typed in a filter stays text.
  const inlined = text.replace(/\$(\d+)/g, (_, n: string) => literal(values[Number(n) - 1]));
  return `copy (${inlined}) to stdout with (format csv)`;
}
