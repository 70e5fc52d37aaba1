// Everything a check is judged against, loaded in one place: instrument, plan, weight and training.
import { and, asc, eq, gte, isNull, lte, or } from "drizzle-orm";
import { checkPlans, checkPlanWeights, instruments, testWeights, trainingRecords } from "../../db/schema";
import type { CheckType } from "../../db/schema/enums";
import type { InstrumentSpec, RequirementSpec, WeightSpec } from "../lib/check-evaluation";
import type { DbOrTx } from "../lib/db.server";

export async function findPlan(db: DbOrTx, instrumentId: number, type: CheckType) {
  const [plan] = await db.select().from(checkPlans).where(and(eq(checkPlans.instrumentId, instrumentId), eq(checkPlans.checkType, type), eq(checkPlans.active, true)));
  return plan ?? null;
}

export async function planWeights(db: DbOrTx, planId: number) {
  return db
    .select({ weight: testWeights })
    .from(checkPlanWeights)
    .innerJoin(testWeights, eq(testWeights.id, checkPlanWeights.weightId))
    .where(eq(checkPlanWeights.planId, planId))
    .orderBy(asc(testWeights.nominalG))
    .then((rows) => rows.map((r) => r.weight));
}

export async function findWeight(db: DbOrTx, siteId: number, identifier: string) {
  const [weight] = await db.select().from(testWeights).where(and(eq(testWeights.identifier, identifier), eq(testWeights.siteId, siteId)));
  return weight ?? null;
}

/** Whether the person holds a training record for the procedure that is valid on `date` (YYYY-MM-DD). */
export async function isTrained(db: DbOrTx, userId: number, procedure: string, date: string) {
  const rows = await db
    .select({ id: trainingRecords.id })
    .from(trainingRecords)
    .where(and(eq(trainingRecords.userId, userId), eq(trainingRecords.procedure, procedure), lte(trainingRecords.trainedOn, date), or(isNull(trainingRecords.expiresOn), gte(trainingRecords.expiresOn, date))))
    .limit(1);
  return rows.length > 0;
}

export function instrumentSpec(row: typeof instruments.$inferSelect): InstrumentSpec {
  return {
    readabilityG: Number(row.readabilityG),
    verificationIntervalG: Number(row.verificationIntervalG),
    capacityG: Number(row.capacityG),
    accuracyClass: row.accuracyClass,
    smallestNetWeightG: row.smallestNetWeightG === null ? null : Number(row.smallestNetWeightG),
  };
}

export function requirementSpec(plan: typeof checkPlans.$inferSelect): RequirementSpec {
  return {
    basis: plan.toleranceBasis,
    value: plan.toleranceValue === null ? null : Number(plan.toleranceValue),
    guardBandPolicy: plan.guardBandPolicy,
    guardBandFraction: Number(plan.guardBandFraction),
    safetyFactor: Number(plan.safetyFactor),
  };
}

export function weightSpec(row: typeof testWeights.$inferSelect): WeightSpec {
  return {
    identifier: row.identifier,
    nominalG: Number(row.nominalG),
    conventionalMassG: Number(row.conventionalMassG),
    expandedUncertaintyG: Number(row.expandedUncertaintyG),
    weightClass: row.weightClass,
    dueOn: row.dueOn,
  };
}
