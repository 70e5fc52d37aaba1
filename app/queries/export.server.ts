// The check export as one parameterised query, streamed from a cursor so memory stays flat at any size.
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

export function exportRowsQuery(viewer: Viewer, params: ExportParams): ExportQuery {
  const { values, where } = filters(viewer, params);
  return {
    text: `select c.id, i.asset_tag, s.code as site, c.check_type, c.performed_at,
        to_char(c.performed_at at time zone s.time_zone, 'YYYY-MM-DD"T"HH24:MI:SS') as performed_local, s.time_zone,
        c.result_g, c.tolerance_g, c.acceptance_g, c.outcome, c.expanded_uncertainty_g,
        (select string_agg(coalesce(r.position::text || '=', '') || r.value::text, ' ' order by r.ordinal) from check_readings r where r.check_id = c.id) as readings,
        c.unit, w.identifier as weight, w.conventional_mass_g, u.name as operator, c.source,
        exists (select 1 from point_annotations a where a.check_id = c.id and a.excluded and a.withdrawn_at is null) as excluded, c.note
      ${FROM} join users u on u.id = c.operator_id left join test_weights w on w.id = c.weight_id
      where ${where} order by c.performed_at, c.id`,
    values,
  };
}

/** One CSV row's cells in header order; numbers stay numbers, times are ISO 8601. */
export function exportCells(row: Record<string, unknown>): (string | number | null)[] {
  const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));
  return [
    Number(row.id), String(row.asset_tag), String(row.site), String(row.check_type), new Date(row.performed_at as string).toISOString(), String(row.performed_local), String(row.time_zone),
    num(row.result_g), num(row.tolerance_g), num(row.acceptance_g), String(row.outcome), num(row.expanded_uncertainty_g), (row.readings as string | null) ?? "", String(row.unit),
    (row.weight as string | null) ?? "", row.conventional_mass_g === null ? null : String(row.conventional_mass_g), String(row.operator), String(row.source), row.excluded ? "yes" : "no", String(row.note ?? ""),
  ];
}
