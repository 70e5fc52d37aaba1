// The test-weight register: suitability against OIML R 111 Table 1 (REFERENCE.md §1, S: two transcriptions that
// agree, data file ../shared/data/OIML_R111-1_2004_Table1_mpe_mg.csv), certificate uploads, expired weights.
import { mkdtempSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { describeWithSharedData, readCsv } from "../../app/lib/stats/shared-data.testing";
import { db } from "../../app/lib/db.server";
import { suitabilityForPlan } from "../../app/queries/weights-suitability.server";
import * as weightDetail from "../../app/routes/weights-detail";
import * as weightNew from "../../app/routes/weights-new";
import * as weightsList from "../../app/routes/weights";
import { auditEvents, checkPlans, checkPlanWeights, instruments, sites, testWeights } from "../../db/schema";
import { cookieFor, request, run } from "../helpers/routes";
import { METROLOGIST, TECHNICIAN } from "../helpers/people";
import { R111_SPOT_VALUES } from "../../app/lib/stats/r111-spot-values.testing";

// Certificates of this file go to a folder of its own, never the development store.
process.env.CERTIFICATE_DIR = mkdtempSync(path.join(os.tmpdir(), "tareline-certificates-"));

const instrument = { capacityG: "100000", accuracyClass: null, verificationIntervalG: "0.001" };
const weight = (weightClass: string, nominalG: number) => ({ identifier: `T-${weightClass}-${nominalG}`, nominalG: String(nominalG), conventionalMassG: String(nominalG), weightClass, expandedUncertaintyG: "0", dueOn: "2099-01-01" });
const sensitivity = (toleranceG: number) => ({ checkType: "sensitivity" as const, toleranceBasis: "absolute" as const, toleranceValue: String(toleranceG) });

describe("suitability against the spot values of REFERENCE.md §1", () => {
  // [class, nominal g, Table 1 mpe in mg]
  it.each(R111_SPOT_VALUES)("%s %i g (mpe %f mg) serves a plan whose T/3 reaches its mpe, and not one whose T/3 falls short", (cls, nominal, mpeMg) => {
    const fits = suitabilityForPlan(sensitivity((3 * mpeMg * 1.001) / 1000), instrument, weight(cls, nominal), "2026-06-01");
    expect(fits).toMatchObject({ suitable: true });
    expect(fits.classMpeG! * 1000).toBeCloseTo(mpeMg, 9);
    const short = suitabilityForPlan(sensitivity((3 * mpeMg * 0.999) / 1000), instrument, weight(cls, nominal), "2026-06-01");
    expect(short.suitable).toBe(false);
    expect(short.problems.join(" ")).toContain(`The ${cls} class mpe (${Number(mpeMg.toPrecision(3))} mg) is more than one third of the tolerance`);
  });
});

describeWithSharedData("suitability against every row of the Table 1 data file", () => {
  it("uses the table's mpe for every class and nominal value it lists (1 g and up)", () => {
    for (const row of readCsv("OIML_R111-1_2004_Table1_mpe_mg.csv").filter((r) => Number(r.nominal_g) >= 1)) {
      for (const cls of ["E1", "E2", "F1", "F2", "M1", "M2", "M3"]) {
        if (!row[cls]) continue;
        const verdict = suitabilityForPlan(sensitivity(1e9), instrument, weight(cls, Number(row.nominal_g)), "2026-06-01");
        expect(verdict.classMpeG! * 1000, `${cls} ${row.nominal}`).toBeCloseTo(Number(row[cls]), 9);
      }
    }
  });
});

describe("ASTM E617 and other checks", () => {
  it("judges an ASTM weight on its certificate U alone, and says so", () => {
    const verdict = suitabilityForPlan(sensitivity(0.0003), instrument, { ...weight("ASTM 1", 100), expandedUncertaintyG: "0.00005" }, "2026-06-01");
    expect(verdict).toMatchObject({ suitable: true, classMpeG: null });
    expect(verdict.notes.join(" ")).toMatch(/ASTM E617 class: .*only the certificate uncertainty/);
    expect(suitabilityForPlan(sensitivity(0.0003), instrument, { ...weight("ASTM 1", 100), expandedUncertaintyG: "0.0002" }, "2026-06-01").suitable).toBe(false);
  });

  it("refuses a weight heavier than Max or past its certificate date; a repeatability load need not be calibrated", () => {
    expect(suitabilityForPlan(sensitivity(10), { ...instrument, capacityG: "220" }, weight("F1", 500), "2026-06-01").problems.join(" ")).toMatch(/heavier than the instrument's Max/);
    expect(suitabilityForPlan(sensitivity(10), instrument, { ...weight("F1", 100), dueOn: "2026-05-31" }, "2026-06-01").problems.join(" ")).toMatch(/due on 2026-05-31, before the check date 2026-06-01/);
    expect(suitabilityForPlan({ checkType: "repeatability", toleranceBasis: "usp41", toleranceValue: null }, instrument, weight("M3", 100), "2026-06-01").suitable).toBe(true);
  });
});

describe("the register's pages", () => {
  let avpId: number;
  let metrologist: string;
  beforeAll(async () => {
    [{ id: avpId }] = await db().select({ id: sites.id }).from(sites).where(eq(sites.code, "AVP"));
    metrologist = await cookieFor(METROLOGIST);
  });

  const form = (identifier: string, extra: Record<string, string> = {}) => ({ identifier, siteId: String(avpId), unit: "g", nominal: "100", conventionalMass: "100.00012", uncertaintyMg: "0.05", weightClass: "M1", certificateNumber: "CAL-T-1", calibratedOn: "2026-01-10", dueOn: "2027-01-10", ...extra });
  const multipart = (fields: Record<string, string>, file?: { name: string; type: string; bytes: Uint8Array }) => {
    const body = new FormData();
    for (const [k, v] of Object.entries(fields)) body.set(k, v);
    if (file) body.set("certificate", new File([new Uint8Array(file.bytes)], file.name, { type: file.type }));
    return body;
  };

  it("registers a weight with a PDF certificate, audited, and serves the file back with its checked type", async () => {
    const pdf = new TextEncoder().encode("%PDF-1.4\n% test certificate\n");
    const result = await run(weightNew.action, request("/weights/new", { method: "POST", cookie: metrologist, body: multipart(form("AVP-T-W1"), { name: "cert.pdf", type: "application/pdf", bytes: pdf }) }));
    expect(result.status).toBe(302);
    const [row] = await db().select().from(testWeights).where(eq(testWeights.identifier, "AVP-T-W1"));
    expect(row).toMatchObject({ nominalG: "100", expandedUncertaintyG: "0.00005", certificateMediaType: "application/pdf", certificateFileName: "cert.pdf" });
    const [audit] = await db().select().from(auditEvents).where(and(eq(auditEvents.entityType, "weight"), eq(auditEvents.entityId, String(row.id))));
    expect(audit.action).toBe("weight.create");
    const { loader } = await import("../../app/routes/weights-certificate");
    const file = await loader({ request: request(`/weights/${row.id}/certificate`, { cookie: metrologist }), params: { id: String(row.id) }, context: {} } as never);
    expect(file.headers.get("Content-Type")).toBe("application/pdf");
    expect(new Uint8Array(await file.arrayBuffer())).toEqual(pdf);
  });

  it("refuses a text file named .pdf (checked by content) and saves nothing", async () => {
    const result = await run(weightNew.action, request("/weights/new", { method: "POST", cookie: metrologist, body: multipart(form("AVP-T-W2"), { name: "cert.pdf", type: "application/pdf", bytes: new TextEncoder().encode("just text") }) }));
    expect(result.status).toBe(400);
    expect(JSON.stringify(result.body)).toMatch(/not a PDF, PNG or JPEG file/);
    expect(await db().select().from(testWeights).where(eq(testWeights.identifier, "AVP-T-W2"))).toHaveLength(0);
  });

  it("a technician may read the register but not add to it", async () => {
    const tech = await cookieFor(TECHNICIAN);
    expect((await run(weightsList.loader, request("/weights", { cookie: tech }))).status).toBe(200);
    expect((await run(weightNew.action, request("/weights/new", { method: "POST", cookie: tech, body: multipart(form("AVP-T-W3")) }))).status).toBe(403);
  });

  it("the weight page says which plans it may not serve and why, and lists the plans that depend on an expired weight", async () => {
    const [w] = await db().select().from(testWeights).where(eq(testWeights.identifier, "AVP-T-W1"));
    const [inst] = await db().select().from(instruments).where(eq(instruments.assetTag, "AVP-AB-04"));
    const [plan] = await db().select().from(checkPlans).where(and(eq(checkPlans.instrumentId, inst.id), eq(checkPlans.checkType, "sensitivity")));
    await db().update(checkPlans).set({ toleranceBasis: "absolute", toleranceValue: "0.003" }).where(eq(checkPlans.id, plan.id));
    await db().insert(checkPlanWeights).values({ planId: plan.id, weightId: w.id });
    const page = await run(weightDetail.loader, request(`/weights/${w.id}`, { cookie: metrologist }), { id: String(w.id) });
    const mine = (page.body as { plans: { planId: number; verdict: { suitable: boolean; problems: string[] } }[] }).plans.find((p) => p.planId === plan.id)!;
    // 100 g M1: mpe 5.0 mg (Table 1) > T/3 = 1 mg.
    expect(mine.verdict.suitable).toBe(false);
    expect(mine.verdict.problems.join(" ")).toContain("The M1 class mpe (5 mg) is more than one third of the tolerance (1 mg).");

    await db().update(testWeights).set({ dueOn: "2026-01-11" }).where(eq(testWeights.id, w.id));
    const expired = await run(weightDetail.loader, request(`/weights/${w.id}`, { cookie: metrologist }), { id: String(w.id) });
    expect(expired.body).toMatchObject({ expired: true });
    // The plan keeps the seeded 200 g E2 weight (mpe 0.3 mg ≤ 1 mg), so it is named as the way out.
    expect((expired.body as { plans: { assetTag: string; alternatives: string[] }[] }).plans.find((p) => p.assetTag === "AVP-AB-04")?.alternatives).toEqual([expect.stringMatching(/^AVP-W-\d\d$/)]);
  });
});
