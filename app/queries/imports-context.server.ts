// What the rows of an import are judged against, loaded in bulk per batch and cached for the whole file:
// instruments by asset tag, their plans per check type, test weights, and named operators with their training.
import { and, asc, desc, eq, inArray, isNull, sql } from "drizzle-orm";
import { checkPlans, checkPlanWeights, checks, impactReviews, instruments, sites, testWeights, trainingRecords, users } from "../../db/schema";
import type { CheckType } from "../../db/schema/enums";
import type { InstrumentSpec, RequirementSpec, WeightSpec } from "../lib/check-evaluation";
import type { RowValues } from "../lib/csv-row";
import type { Database } from "../lib/db.server";
import { can, visibleSiteIds, type Viewer } from "../lib/permissions";
import { instrumentSpec, requirementSpec, weightSpec } from "./check-context.server";

const CACHE_LIMIT = 50_000;

export interface InstrumentContext {
  row: typeof instruments.$inferSelect;
  siteCode: string;
  timeZone: string;
  spec: InstrumentSpec;
  /** Why no row of this instrument can be imported by this person, or null. */
  refusal: string | null;
  /** For an out-of-service instrument: rows up to the check that failed are history; later ones are refused. */
  outOfServiceSince: Date | null;
}

export interface PlanContext {
  plan: typeof checkPlans.$inferSelect;
  requirement: RequirementSpec;
  defaultWeight: WeightContext | null;
}

export interface WeightContext {
  row: typeof testWeights.$inferSelect;
  spec: WeightSpec;
}

export interface OperatorContext {
  id: number;
  training: { procedure: string; trainedOn: string; expiresOn: string | null }[];
}

export class ImportContext {
  readonly instruments = new Map<string, InstrumentContext | null>();
  readonly plans = new Map<string, PlanContext | null>();
  readonly weights = new Map<string, WeightContext | null>();
  readonly operators = new Map<string, OperatorContext | null>();

  constructor(
    private readonly db: Database,
    private readonly viewer: Viewer,
  ) {}

  static planKey = (instrumentId: number, type: CheckType) => `${instrumentId}:${type}`;

  /** Loads what the batch needs and the cache lacks: one query per kind, not one per row. */
  async prefetch(rows: RowValues[]): Promise<void> {
    // A file of countless distinct unknown tags must not grow the cache without end; emptied only between batches.
    for (const map of [this.instruments, this.plans, this.weights, this.operators]) if (map.size > CACHE_LIMIT) map.clear();
    const tags = new Set<string>();
    const weightIds = new Set<string>();
    const emails = new Set<string>();
    for (const r of rows) {
      if (r.asset_tag && !this.instruments.has(r.asset_tag)) tags.add(r.asset_tag);
      if (r.weight && !this.weights.has(r.weight)) weightIds.add(r.weight);
      if (r.operator_email && !this.operators.has(r.operator_email.toLowerCase())) emails.add(r.operator_email.toLowerCase());
    }
    if (tags.size) await this.loadInstruments([...tags]);
    if (weightIds.size) await this.loadWeights([...weightIds]);
    if (emails.size) await this.loadOperators([...emails]);
  }

  isTrained(operator: OperatorContext, procedure: string, date: string): boolean {
    return operator.training.some((t) => t.procedure === procedure && t.trainedOn <= date && (t.expiresOn === null || t.expiresOn >= date));
  }

  private async loadInstruments(tags: string[]) {
    const ids = visibleSiteIds(this.viewer);
    const rows = await this.db
      .select({ row: instruments, siteCode: sites.code, timeZone: sites.timeZone })
      .from(instruments)
      .innerJoin(sites, eq(sites.id, instruments.siteId))
      .where(inArray(instruments.assetTag, tags));
    const found = rows.filter((r) => ids === null || ids.includes(r.row.siteId));
    const failedAt = await this.outOfServiceSince(found.filter((r) => r.row.status === "out_of_service").map((r) => r.row.id));
    for (const tag of tags) this.instruments.set(tag, null);
    for (const { row, siteCode, timeZone } of found) {
      const since = failedAt.get(row.id) ?? null;
      let refusal: string | null = null;
      if (!can(this.viewer, "import_csv", row.siteId)) refusal = `Your role at ${siteCode} does not import checks.`;
      else if (row.status === "retired") refusal = `${row.assetTag} is retired; no checks are added to a retired instrument.`;
      else if (row.status === "out_of_service" && !since) refusal = `${row.assetTag} is out of service; a metrologist must release it before its checks are imported.`;
      this.instruments.set(row.assetTag, { row, siteCode, timeZone, spec: instrumentSpec(row), refusal, outOfServiceSince: since });
    }
    await this.loadPlans(found.map((r) => r.row.id));
  }

  private async outOfServiceSince(instrumentIds: number[]): Promise<Map<number, Date>> {
    if (!instrumentIds.length) return new Map();
    const rows = await this.db
      .selectDistinctOn([impactReviews.instrumentId], { instrumentId: impactReviews.instrumentId, at: checks.performedAt })
      .from(impactReviews)
      .innerJoin(checks, eq(checks.id, impactReviews.failedCheckId))
      .where(and(inArray(impactReviews.instrumentId, instrumentIds), isNull(impactReviews.closedAt)))
      .orderBy(impactReviews.instrumentId, desc(impactReviews.openedAt));
    return new Map(rows.map((r) => [r.instrumentId, r.at]));
  }

  private async loadPlans(instrumentIds: number[]) {
    if (!instrumentIds.length) return;
    const plans = await this.db.select().from(checkPlans).where(and(inArray(checkPlans.instrumentId, instrumentIds), eq(checkPlans.active, true)));
    const planWeights = plans.length
      ? await this.db.select({ planId: checkPlanWeights.planId, weight: testWeights }).from(checkPlanWeights).innerJoin(testWeights, eq(testWeights.id, checkPlanWeights.weightId)).where(inArray(checkPlanWeights.planId, plans.map((p) => p.id))).orderBy(asc(testWeights.nominalG))
      : [];
    for (const id of instrumentIds) for (const type of ["sensitivity", "repeatability", "eccentricity"] as const) this.plans.set(ImportContext.planKey(id, type), null);
    for (const plan of plans) {
      const weight = planWeights.filter((w) => w.planId === plan.id).at(-1)?.weight;
      this.plans.set(ImportContext.planKey(plan.instrumentId, plan.checkType), { plan, requirement: requirementSpec(plan), defaultWeight: weight ? { row: weight, spec: weightSpec(weight) } : null });
    }
  }

  private async loadWeights(identifiers: string[]) {
    const rows = await this.db.select().from(testWeights).where(inArray(testWeights.identifier, identifiers));
    for (const id of identifiers) this.weights.set(id, null);
    for (const row of rows) this.weights.set(row.identifier, { row, spec: weightSpec(row) });
  }

  private async loadOperators(emails: string[]) {
    const people = await this.db.select({ id: users.id, email: users.email }).from(users).where(inArray(sql`lower(${users.email})`, emails));
    const training = people.length
      ? await this.db.select({ userId: trainingRecords.userId, procedure: trainingRecords.procedure, trainedOn: trainingRecords.trainedOn, expiresOn: trainingRecords.expiresOn }).from(trainingRecords).where(inArray(trainingRecords.userId, people.map((p) => p.id)))
      : [];
    for (const email of emails) this.operators.set(email, null);
    for (const p of people) this.operators.set(p.email.toLowerCase(), { id: p.id, training: training.filter((t) => t.userId === p.id) });
  }
}
