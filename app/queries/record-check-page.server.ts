// What the record-a-check page needs: the instrument's plan, the weights it may use and whether the person may record.
import { and, asc, eq } from "drizzle-orm";
import { testWeights } from "../../db/schema";
import type { CheckType } from "../../db/schema/enums";
import type { DbOrTx } from "../lib/db.server";
import { evaluateCheck } from "../lib/check-evaluation";
import { findPlan, instrumentSpec, isTrained, planWeights, requirementSpec, weightSpec } from "./check-context.server";
import { instruments } from "../../db/schema";

const HEAVY_WEIGHT_G = 20_000;

export async function loadRecordCheckPage(db: DbOrTx, params: { instrument: typeof instruments.$inferSelect; type: CheckType; userId: number; today: string }) {
  const { instrument, type, today } = params;
  const plan = await findPlan(db, instrument.id, type);
  const trained = await isTrained(db, params.userId, type, today);
  const siteWeights = await db.select().from(testWeights).where(and(eq(testWeights.siteId, instrument.siteId))).orderBy(asc(testWeights.nominalG));
  const assigned = plan ? await planWeights(db, plan.id) : [];
  const spec = instrumentSpec(instrument);
  const requirement = plan ? requirementSpec(plan) : null;
  // A weight is offered with its verdict for this plan: expired or unsuitable weights cannot be chosen.
  const weights = siteWeights
    .filter((w) => Number(w.nominalG) <= spec.capacityG)
    .map((w) => {
      const verdict = requirement && type !== "repeatability" ? evaluateCheck({ type, instrument: spec, requirement, weight: weightSpec(w), readings: probeReadings(type, Number(w.conventionalMassG)), checkDate: today }) : null;
      return {
        ...weightSpec(w),
        id: w.id,
        certificateNumber: w.certificateNumber,
        assigned: assigned.some((a) => a.id === w.id),
        heavy: Number(w.nominalG) > HEAVY_WEIGHT_G,
        problems: verdict && !verdict.ok ? verdict.problems : [],
      };
    });
  const suggested = type === "repeatability" ? null : (weights.filter((w) => w.assigned && !w.problems.length).at(-1) ?? weights.filter((w) => !w.problems.length).at(-1) ?? null);
  return { plan, requirement, trained, weights, suggestedWeight: suggested?.identifier ?? null, instrumentSpec: spec };
}

/** Readings that put the indication on the weight's value, so only the weight's own suitability is judged. */
function probeReadings(type: CheckType, grams: number) {
  if (type === "eccentricity") return ["centre", "front-left", "back-left", "back-right", "front-right"].map((position) => ({ entered: String(grams), grams, position: position as "centre" }));
  return [{ entered: String(grams), grams, position: null }];
}
