// The instrument's checks table: filtered, sorted and paginated in SQL, readings included.
import { and, asc, count, desc, eq, isNull, sql } from "drizzle-orm";
import { checkReadings, checks, pointAnnotations, testWeights, users } from "../../db/schema";
import type { DbOrTx } from "../lib/db.server";
import type { CheckTableParams } from "../lib/check-table-params";

const SORTS = { performedAt: checks.performedAt, result: checks.resultG, outcome: checks.outcome, type: checks.checkType };

export async function listInstrumentChecks(db: DbOrTx, instrumentId: number, params: CheckTableParams) {
  const where = and(eq(checks.instrumentId, instrumentId), params.ctype ? eq(checks.checkType, params.ctype) : undefined, params.coutcome ? eq(checks.outcome, params.coutcome) : undefined);
  const order = params.cdir === "asc" ? asc : desc;
  const excluded = sql<boolean>`exists (select 1 from ${pointAnnotations} where ${pointAnnotations.checkId} = ${checks.id} and ${pointAnnotations.excluded} and ${pointAnnotations.withdrawnAt} is null)`;
  const notes = sql<string | null>`(select string_agg(${pointAnnotations.reason}, ' · ' order by ${pointAnnotations.id}) from ${pointAnnotations} where ${pointAnnotations.checkId} = ${checks.id})`;
  const readings = sql<string>`(select string_agg(coalesce(${checkReadings.position}::text || ' ', '') || ${checkReadings.value}::text, ', ' order by ${checkReadings.ordinal}) from ${checkReadings} where ${checkReadings.checkId} = ${checks.id})`;
  const [rows, [{ total }]] = await Promise.all([
    db
      .select({ id: checks.id, type: checks.checkType, performedAt: checks.performedAt, outcome: checks.outcome, resultG: checks.resultG, toleranceG: checks.toleranceG, uncertaintyG: checks.expandedUncertaintyG, unit: checks.unit, operator: users.name, weight: testWeights.identifier, excluded, notes, readings })
      .from(checks)
      .innerJoin(users, eq(users.id, checks.operatorId))
      .leftJoin(testWeights, eq(testWeights.id, checks.weightId))
      .where(and(where, isNull(checks.supersededAt)))
      .orderBy(order(SORTS[params.csort]), desc(checks.id))
      .limit(params.cper)
      .offset((params.cpage - 1) * params.cper),
    db.select({ total: count() }).from(checks).where(and(where, isNull(checks.supersededAt))),
  ]);
  return { rows, total, page: params.cpage, pages: Math.max(1, Math.ceil(total / params.cper)) };
}

export type InstrumentCheckRow = Awaited<ReturnType<typeof listInstrumentChecks>>["rows"][number];
