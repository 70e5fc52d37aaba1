// Seeds the invented demo scenario (DESIGN.md §6) in one transaction; a second run adds nothing.
import { eq } from "drizzle-orm";
import type { Database } from "../../app/lib/db.server";
import { KIND_LABELS } from "../../app/lib/instrument-form";
import { checkPlans, checkPlanWeights, instruments, memberships, rooms, sites, testWeights, trainingRecords, users } from "../schema";
import { fleetFor, ROOMS } from "./instruments";
import { DEMO_PEOPLE, DEMO_SITES } from "./people";
import { demoToday, SEED, seededRandom } from "./random";
import { ECCENTRICITY_STORY, seedHistory } from "./history";
import { seedProgramme } from "./programme";
import { weightsFor } from "./weights";

const day = 86_400_000;
const isoDate = (d: Date) => d.toISOString().slice(0, 10);

export async function seedDemo(db: Database): Promise<{ created: boolean; instruments: number }> {
  return db.transaction(async (tx) => {
    const existing = await tx.select({ id: sites.id }).from(sites).where(eq(sites.code, DEMO_SITES[0].code));
    if (existing.length) return { created: false, instruments: 0 };
    const random = seededRandom(SEED);

    const siteRows = await tx.insert(sites).values(DEMO_SITES.map((s) => ({ ...s }))).returning();
    const siteId = (code: string) => siteRows.find((s) => s.code === code)!.id;
    const roomRows = await tx.insert(rooms).values(siteRows.flatMap((s) => ROOMS[s.code].map((name) => ({ siteId: s.id, name })))).returning();

    const people = await tx.insert(users).values(DEMO_PEOPLE.map((p) => ({ email: p.email, name: p.name }))).returning();
    await tx.insert(memberships).values(DEMO_PEOPLE.flatMap((p, i) => p.siteCodes.map((code) => ({ userId: people[i].id, siteId: siteId(code), role: p.role }))));
    const metrologist = people[DEMO_PEOPLE.findIndex((p) => p.role === "metrologist")];

    const training = DEMO_PEOPLE.flatMap((p, i) =>
      p.training.map((entry) => {
        const expired = entry.startsWith("expired:");
        const trainedOn = new Date(demoToday().getTime() - (expired ? 430 : 120) * day);
        return {
          userId: people[i].id,
          procedure: entry.replace("expired:", ""),
          trainedOn: isoDate(trainedOn),
          trainerName: "Milo Ferrante",
          expiresOn: isoDate(new Date(trainedOn.getTime() + 365 * day)),
          evidence: expired ? "Annual refresher not yet attended." : "Practical assessment passed.",
        };
      }),
    );
    if (training.length) await tx.insert(trainingRecords).values(training);

    const weightRows = await tx.insert(testWeights).values(siteRows.flatMap((s) => weightsFor(s.code, s.id, random))).returning();

    let instrumentCount = 0;
    for (const site of siteRows) {
      const siteRooms = roomRows.filter((r) => r.siteId === site.id);
      const specs = fleetFor(site.code);
      const inserted = await tx
        .insert(instruments)
        .values(
          specs.map((spec, i) => ({
            siteId: site.id,
            roomId: siteRooms[i % siteRooms.length].id,
            assetTag: spec.tag,
            kind: spec.kind,
            description: `${KIND_LABELS[spec.kind]} in ${siteRooms[i % siteRooms.length].name.toLowerCase()}`,
            serialNumber: `SN-${Math.floor(random() * 9e6 + 1e6)}`,
            capacityG: spec.capacityG,
            readabilityG: spec.readabilityG,
            verificationIntervalG: spec.verificationIntervalG,
            displayUnit: spec.displayUnit,
            accuracyClass: spec.accuracyClass,
            smallestNetWeightG: spec.smallestNetWeightG,
            riskLevel: spec.riskLevel,
            ownerId: metrologist.id,
          })),
        )
        .returning();
      instrumentCount += inserted.length;
      const siteWeights = weightRows.filter((w) => w.siteId === site.id);
      const plans = await tx.insert(checkPlans).values(inserted.flatMap((inst) => plansFor(inst))).returning();
      await tx.insert(checkPlanWeights).values(
        plans.flatMap((plan) => {
          const inst = inserted.find((i) => i.id === plan.instrumentId)!;
          const weight = weightForPlan(plan.checkType, Number(inst.capacityG), siteWeights);
          return weight ? [{ planId: plan.id, weightId: weight.id }] : [];
        }),
      );
    }
    await seedHistory(tx, random);
    await seedProgramme(tx);
    return { created: true, instruments: instrumentCount };
  });
}

/** Sensitivity and eccentricity: the largest weight the pan takes; repeatability: the one nearest 5 % of Max (common practice). */
function weightForPlan(type: string, capacityG: number, weights: { id: number; nominalG: string }[]) {
  const fitting = weights.filter((w) => Number(w.nominalG) <= capacityG).sort((a, b) => Number(a.nominalG) - Number(b.nominalG));
  if (type !== "repeatability") return fitting.at(-1);
  return [...fitting].sort((a, b) => Math.abs(Number(a.nominalG) - 0.05 * capacityG) - Math.abs(Number(b.nominalG) - 0.05 * capacityG))[0];
}

function plansFor(inst: typeof instruments.$inferSelect) {
  const high = inst.riskLevel === "high";
  // High-risk analytical balances serve assays with a process tolerance tighter than USP <41>'s 0.10 %: 1 mg absolute.
  // Floor scales are checked with loads far below 5 % of Max, where 0.10 % is finer than d: judge them by R 76.
  const sensitivity: Partial<typeof checkPlans.$inferInsert> =
    high && inst.kind === "analytical_balance" ? { toleranceBasis: "absolute", toleranceValue: "0.001" } : inst.kind === "floor_scale" ? { toleranceBasis: "oiml_r76_in_service" } : { toleranceBasis: "usp41" };
  const plans: (typeof checkPlans.$inferInsert)[] = [
    { instrumentId: inst.id, checkType: "sensitivity", intervalDays: high ? 1 : 7, toleranceBasis: "usp41", ...sensitivity },
    { instrumentId: inst.id, checkType: "repeatability", intervalDays: high ? 7 : 30, toleranceBasis: "usp41", repetitions: 10 },
  ];
  // The eccentricity story's balance is checked monthly, so the step after its relocation shows.
  const eccentricityDays = high || inst.assetTag === ECCENTRICITY_STORY ? 30 : 90;
  if (inst.riskLevel !== "low") plans.push({ instrumentId: inst.id, checkType: "eccentricity", intervalDays: eccentricityDays, toleranceBasis: "oiml_r76_in_service" });
  return plans;
}
