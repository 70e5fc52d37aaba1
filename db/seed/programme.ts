// The programme's part of the demo: each plan carries the risk reasoning it was set with, and one training record
// falls due soon, so the expiring lists and reminders have something to show (DESIGN.md §6).
import { eq } from "drizzle-orm";
import type { Transaction } from "../../app/lib/db.server";
import { assessRisk, type Consequence } from "../../app/lib/risk";
import { checkPlans, instruments, trainingRecords, users } from "../schema";
import { demoToday } from "./random";

const DAY = 86_400_000;
const isoDate = (d: Date) => d.toISOString().slice(0, 10);
const CONSEQUENCE: Record<"low" | "medium" | "high", Consequence> = { high: "patient_safety", medium: "product_release", low: "internal_use" };

export async function seedProgramme(tx: Transaction) {
  const rows = await tx.select({ plan: checkPlans, instrument: instruments }).from(checkPlans).innerJoin(instruments, eq(instruments.id, checkPlans.instrumentId));
  for (const { plan, instrument } of rows) {
    const risk = assessRisk({
      consequence: CONSEQUENCE[instrument.riskLevel],
      smallestNetWeightG: instrument.smallestNetWeightG === null ? null : Number(instrument.smallestNetWeightG),
      processTolerancePercent: instrument.processTolerancePercent === null ? null : Number(instrument.processTolerancePercent),
      readabilityG: Number(instrument.readabilityG),
      verificationIntervalG: Number(instrument.verificationIntervalG),
      accuracyClass: instrument.accuracyClass,
      measuredMinimumWeightG: null,
      safetyFactor: Number(plan.safetyFactor),
    });
    const assessment = { ...risk, assessedAt: new Date(demoToday().getTime() - 400 * DAY).toISOString(), assessedBy: "Milo Ferrante", chosenIntervalDays: plan.intervalDays, intervalReason: "Set when the routine-check programme was introduced." };
    await tx.update(checkPlans).set({ riskAssessment: assessment }).where(eq(checkPlans.id, plan.id));
  }
  const [tomas] = await tx.select({ id: users.id }).from(users).where(eq(users.email, "tomas.technician@quillmere.test"));
  if (tomas) {
    const trainedOn = new Date(demoToday().getTime() - 345 * DAY);
    await tx.insert(trainingRecords).values({ userId: tomas.id, procedure: "linearity", trainedOn: isoDate(trainedOn), trainerName: "Milo Ferrante", expiresOn: isoDate(new Date(trainedOn.getTime() + 365 * DAY)), evidence: "Practical assessment passed; refresher booked." });
  }
}
