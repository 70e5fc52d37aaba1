// Two years of generated checks for the demo fleet, with the stories of DESIGN.md §6: a slow sensitivity drift that
// the forecast catches weeks before it leaves tolerance, a worsening repeatability, an eccentricity step after a
// relocation, and some overdue plans. Results are judged by the same engine composition as every other check.
import { eq, inArray } from "drizzle-orm";
import type { Transaction } from "../../app/lib/db.server";
import { evaluateCheck } from "../../app/lib/check-evaluation";
import type { ParsedReading } from "../../app/lib/check-readings";
import { decimalsOf, fromGrams } from "../../app/lib/units";
import { instrumentSpec, requirementSpec, weightSpec } from "../../app/queries/check-context.server";
import { dedupeKey } from "../../app/queries/checks.server";
import { refreshSeriesSummary } from "../../app/queries/series-summary.server";
import { checkPlans, checkPlanWeights, checkReadings, checks, instrumentEvents, instruments, memberships, testWeights, users } from "../schema";
import { normal } from "./random";
import { demoToday } from "./random";
import { readingsEnteredSql } from "../../app/queries/readings-entered.server";

export const DRIFT_STORY = "AVP-AB-01";
export const REPEATABILITY_STORY = "AVP-SM-02";
export const ECCENTRICITY_STORY = "QNW-PB-02";
// Plans whose last check is well past due on the reference date.
const OVERDUE: Record<string, { type: string; lastDaysAgo: number }> = {
  "LNT-PB-01": { type: "sensitivity", lastDaysAgo: 18 },
  "LNT-PB-02": { type: "sensitivity", lastDaysAgo: 25 },
  "QNW-BS-02": { type: "repeatability", lastDaysAgo: 45 },
};

const DAY = 86_400_000;
const HISTORY_DAYS = 730;
const ECC_POSITIONS = ["centre", "front-left", "back-left", "back-right", "front-right"] as const;
const RELOCATION_DAYS_AGO = 200;
const DRIFT_START_DAYS_AGO = 70;
// From zero 70 days before the reference date to the 1 mg tolerance 42 days after it: the acceptance limit
// (2/3 mg) is crossed about 5 days after the reference date, so the forecast warns six weeks ahead.
const DRIFT_PER_DAY_G = 0.001 / (DRIFT_START_DAYS_AGO + 42);

type InstrumentRow = typeof instruments.$inferSelect;

const daysAgo = (at: Date) => (demoToday().getTime() - at.getTime()) / DAY;

function calibrationDaysAgo(index: number, tag: string): number[] {
  if (tag === DRIFT_STORY) return [85, 450];
  const recent = 120 + ((index * 17) % 90);
  return [recent, recent + 365];
}

function roundTo(grams: number, readabilityG: string): string {
  return grams.toFixed(decimalsOf(readabilityG));
}

function reading(grams: number, inst: InstrumentRow, position: ParsedReading["position"] = null): ParsedReading {
  const text = roundTo(grams, inst.readabilityG);
  return { entered: fromGrams(text, inst.displayUnit), grams: Number(text), position };
}

function sensitivityReadings(inst: InstrumentRow, load: number, at: Date, bias: number, random: () => number): ParsedReading[] {
  const d = Number(inst.readabilityG);
  const drift = inst.assetTag === DRIFT_STORY ? Math.max(0, DRIFT_START_DAYS_AGO - daysAgo(at)) * DRIFT_PER_DAY_G : 0;
  // Scales read far coarser than their load's noise; balances show about a digit of scatter.
  const scatter = inst.kind === "floor_scale" || inst.kind === "bench_scale" ? 0.25 : 0.7;
  return [reading(load + bias + drift + scatter * d * normal(random), inst)];
}

function repeatabilityReadings(inst: InstrumentRow, load: number, at: Date, random: () => number): ParsedReading[] {
  const d = Number(inst.readabilityG);
  let sigma = inst.kind === "floor_scale" ? 0.45 * d : 0.5 * d;
  if (inst.assetTag === REPEATABILITY_STORY) sigma = d * (0.42 + 0.38 * Math.min(1, Math.max(0, (300 - daysAgo(at)) / 300)));
  return Array.from({ length: 10 }, () => reading(load + sigma * normal(random), inst));
}

function eccentricityReadings(inst: InstrumentRow, load: number, at: Date, pattern: number[], random: () => number): ParsedReading[] {
  const d = Number(inst.readabilityG);
  const centre = load + 0.5 * d * normal(random);
  const step = inst.assetTag === ECCENTRICITY_STORY && daysAgo(at) < RELOCATION_DAYS_AGO ? [12, -9, 6, -4] : [0, 0, 0, 0];
  return ECC_POSITIONS.map((position, i) => reading(i === 0 ? centre : centre + (pattern[i - 1] + step[i - 1] + 0.4 * normal(random)) * d, inst, position));
}

/** Check times: one per interval from two years back, at a working hour, with a few missed days on daily plans. */
function schedule(intervalDays: number, random: () => number, lastDaysAgo = 0): Date[] {
  const times: Date[] = [];
  for (let ago = HISTORY_DAYS - Math.floor(random() * intervalDays); ago > lastDaysAgo; ago -= intervalDays) {
    if (intervalDays === 1 && random() < 0.04) continue;
    const base = demoToday().getTime() - ago * DAY;
    times.push(new Date(Math.floor(base / DAY) * DAY + (7 * 60 + Math.floor(random() * 120)) * 60_000));
  }
  return times;
}

export async function seedHistory(tx: Transaction, random: () => number) {
  const fleet = await tx.select().from(instruments).orderBy(instruments.id);
  const plans = await tx.select().from(checkPlans).where(inArray(checkPlans.instrumentId, fleet.map((i) => i.id)));
  const assigned = await tx.select({ planId: checkPlanWeights.planId, weight: testWeights }).from(checkPlanWeights).innerJoin(testWeights, eq(testWeights.id, checkPlanWeights.weightId));
  const technicians = await tx.select({ userId: memberships.userId, siteId: memberships.siteId, role: memberships.role, email: users.email }).from(memberships).innerJoin(users, eq(users.id, memberships.userId));
  const operatorAt = (siteId: number, type: string) => {
    const techs = technicians.filter((t) => t.siteId === siteId && t.role === "technician");
    // The QNW technician's repeatability training has lapsed, so the metrologist has run those checks.
    const lapsed = type === "repeatability" && techs.some((t) => t.email.startsWith("rhea."));
    const metrologist = technicians.find((t) => t.siteId === siteId && t.role === "metrologist");
    return (lapsed ? metrologist : techs[0] ?? metrologist)!.userId;
  };

  const events = fleet.flatMap((inst, i) => [
    ...calibrationDaysAgo(i, inst.assetTag).map((ago) => ({ instrumentId: inst.id, kind: "calibration" as const, occurredAt: new Date(demoToday().getTime() - ago * DAY), note: "Annual calibration by the accredited provider (demo)." })),
    ...(inst.assetTag === ECCENTRICITY_STORY ? [{ instrumentId: inst.id, kind: "relocation" as const, occurredAt: new Date(demoToday().getTime() - RELOCATION_DAYS_AGO * DAY), note: "Moved to the packing hall bench (demo)." }] : []),
  ]);
  await tx.insert(instrumentEvents).values(events);

  const rows: { values: typeof checks.$inferInsert; readings: ParsedReading[] }[] = [];
  for (const plan of plans) {
    const inst = fleet.find((i) => i.id === plan.instrumentId)!;
    const weight = assigned.find((a) => a.planId === plan.id)?.weight ?? null;
    if (!weight) continue;
    const load = Number(weight.conventionalMassG);
    const bias = 0.3 * Number(inst.readabilityG) * normal(random);
    const pattern = [0, 0, 0, 0].map(() => 0.5 * normal(random));
    const overdue = OVERDUE[inst.assetTag]?.type === plan.checkType ? OVERDUE[inst.assetTag].lastDaysAgo : 0;
    for (const at of schedule(plan.intervalDays, random, overdue)) {
      const readings =
        plan.checkType === "sensitivity" ? sensitivityReadings(inst, load, at, bias, random) : plan.checkType === "repeatability" ? repeatabilityReadings(inst, load, at, random) : eccentricityReadings(inst, load, at, pattern, random);
      const judged = evaluateCheck({ type: plan.checkType, instrument: instrumentSpec(inst), requirement: requirementSpec(plan), weight: plan.checkType === "repeatability" ? null : weightSpec(weight), readings, checkDate: at.toISOString().slice(0, 10) });
      if (!judged.ok) continue;
      const e = judged.evaluation;
      rows.push({
        readings,
        values: {
          instrumentId: inst.id, checkType: plan.checkType, planId: plan.id, weightId: plan.checkType === "repeatability" ? null : weight.id, operatorId: operatorAt(inst.siteId, plan.checkType),
          performedAt: at, recordedAt: at, unit: inst.displayUnit, resultG: e.resultG, expandedUncertaintyG: e.expandedUncertaintyG, toleranceG: e.toleranceG, acceptanceG: e.acceptanceG,
          outcome: e.outcome, basis: e.basis, details: e.details, source: "import", note: "Demo history",
          dedupeKey: dedupeKey(inst.id, plan.checkType, at, inst.displayUnit, readings.map((r) => r.entered)),
        },
      });
    }
  }

  for (let i = 0; i < rows.length; i += 500) {
    const batch = rows.slice(i, i + 500);
    const ids = await tx.insert(checks).values(batch.map((r) => ({ ...r.values, readingsEntered: readingsEnteredSql(r.readings) }))).returning({ id: checks.id });
    await tx.insert(checkReadings).values(batch.flatMap((r, j) => r.readings.map((reading, k) => ({ checkId: ids[j].id, ordinal: k + 1, position: reading.position, value: reading.entered }))));
  }
  for (const plan of plans) await refreshSeriesSummary(tx, plan.instrumentId, plan.checkType, demoToday());
  return rows.length;
}
