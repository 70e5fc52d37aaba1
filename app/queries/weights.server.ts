// The test-weight register: certificates, custody and which plans each weight may serve.
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { checkPlans, checkPlanWeights, instruments, sites, testWeights } from "../../db/schema";
import type { WeightForm } from "../components/weights/weight-form-schema";
import type { Database, DbOrTx } from "../lib/db.server";
import { notFoundPage } from "../lib/http.server";
import { visibleSiteIds, type Viewer } from "../lib/permissions";
import { certificateStorage } from "../lib/storage.server";
import type { CertificateMediaType } from "../lib/storage";
import { toGrams } from "../lib/units";
import { writeAudit } from "./audit.server";
import { suitabilityForPlan } from "./weights-suitability.server";

export class DuplicateWeightError extends Error {}

export async function listWeights(db: DbOrTx, viewer: Viewer, siteId?: number) {
  const ids = visibleSiteIds(viewer);
  return db
    .select({
      weight: testWeights,
      siteCode: sites.code,
      timeZone: sites.timeZone,
      plans: sql<number>`(select count(*)::int from ${checkPlanWeights} where ${checkPlanWeights.weightId} = ${testWeights.id})`,
    })
    .from(testWeights)
    .innerJoin(sites, eq(sites.id, testWeights.siteId))
    .where(and(ids === null ? undefined : inArray(testWeights.siteId, ids.length ? ids : [-1]), siteId ? eq(testWeights.siteId, siteId) : undefined))
    .orderBy(asc(sites.code), asc(testWeights.nominalG), asc(testWeights.identifier));
}

export async function getWeight(db: DbOrTx, viewer: Viewer, id: number) {
  const ids = visibleSiteIds(viewer);
  if (!Number.isSafeInteger(id) || id <= 0) throw notFoundPage("No such test weight.");
  const [row] = await db
    .select({ weight: testWeights, siteCode: sites.code, siteName: sites.name, timeZone: sites.timeZone })
    .from(testWeights)
    .innerJoin(sites, eq(sites.id, testWeights.siteId))
    .where(and(eq(testWeights.id, id), ids === null ? undefined : inArray(testWeights.siteId, ids.length ? ids : [-1])));
  if (!row) throw notFoundPage("No test weight with that number is visible to you.");
  return row;
}

/** Every plan that uses the weight, with the verdict and, for each, whether another usable weight is assigned. */
export async function plansUsingWeight(db: DbOrTx, weight: typeof testWeights.$inferSelect, today: string) {
  const rows = await db
    .select({ plan: checkPlans, instrument: instruments })
    .from(checkPlanWeights)
    .innerJoin(checkPlans, eq(checkPlans.id, checkPlanWeights.planId))
    .innerJoin(instruments, eq(instruments.id, checkPlans.instrumentId))
    .where(eq(checkPlanWeights.weightId, weight.id))
    .orderBy(asc(instruments.assetTag), asc(checkPlans.checkType));
  const planIds = rows.map((r) => r.plan.id);
  const others = planIds.length
    ? await db.select({ planId: checkPlanWeights.planId, weight: testWeights }).from(checkPlanWeights).innerJoin(testWeights, eq(testWeights.id, checkPlanWeights.weightId)).where(inArray(checkPlanWeights.planId, planIds))
    : [];
  return rows.map(({ plan, instrument }) => {
    const verdict = suitabilityForPlan(plan, instrument, weight, today);
    const alternatives = others.filter((o) => o.planId === plan.id && o.weight.id !== weight.id && suitabilityForPlan(plan, instrument, o.weight, today).suitable).map((o) => o.weight.identifier);
    return { planId: plan.id, checkType: plan.checkType, active: plan.active, instrumentId: instrument.id, assetTag: instrument.assetTag, instrumentStatus: instrument.status, verdict, alternatives };
  });
}

function columns(form: WeightForm) {
  return {
    identifier: form.identifier,
    setLabel: form.setLabel || null,
    siteId: form.siteId,
    nominalG: toGrams(form.nominal, form.unit),
    conventionalMassG: toGrams(form.conventionalMass, form.unit),
    expandedUncertaintyG: toGrams(form.uncertaintyMg, "mg"),
    weightClass: form.weightClass,
    certificateNumber: form.certificateNumber,
    calibratedOn: form.calibratedOn,
    dueOn: form.dueOn,
  };
}

export interface CertificateUpload {
  bytes: Uint8Array;
  mediaType: CertificateMediaType;
  fileName: string;
}

async function assertIdentifierFree(tx: DbOrTx, identifier: string, exceptId?: number) {
  const [clash] = await tx.select({ id: testWeights.id }).from(testWeights).where(sql`lower(${testWeights.identifier}) = lower(${identifier})`);
  if (clash && clash.id !== exceptId) throw new DuplicateWeightError(`Identifier ${identifier} is already registered.`);
}

/** The file is stored first (a new key, never overwriting), then the row and its audit event in one transaction. */
export async function saveWeight(db: Database, actor: Viewer, params: { id: number | null; form: WeightForm; certificate: CertificateUpload | null }) {
  const key = params.certificate ? await certificateStorage().put(params.certificate.bytes, params.certificate.mediaType) : null;
  const file = params.certificate && key ? { certificateFile: key, certificateFileName: params.certificate.fileName, certificateMediaType: params.certificate.mediaType } : {};
  return db.transaction(async (tx) => {
    await assertIdentifierFree(tx, params.form.identifier, params.id ?? undefined);
    if (params.id === null) {
      const [row] = await tx.insert(testWeights).values({ ...columns(params.form), ...file }).returning();
      await writeAudit(tx, { actorId: actor.id, action: "weight.create", entityType: "weight", entityId: String(row.id), siteId: row.siteId, after: row });
      return row;
    }
    const [before] = await tx.select().from(testWeights).where(eq(testWeights.id, params.id)).for("update");
    const [after] = await tx.update(testWeights).set({ ...columns(params.form), ...file }).where(eq(testWeights.id, params.id)).returning();
    await writeAudit(tx, { actorId: actor.id, action: key ? "weight.update_with_certificate" : "weight.update", entityType: "weight", entityId: String(after.id), siteId: after.siteId, before, after });
    return after;
  });
}
