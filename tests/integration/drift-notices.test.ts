// A new drift signal is notified once per episode, not once per check.
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { recordCheck } from "../../app/queries/checks.server";
import { getViewer } from "../../app/queries/people.server";
import { instruments, notifications, users } from "../../db/schema";
import { TECHNICIAN } from "../helpers/people";

describe("drift notices", () => {
  it("notify the metrologists once when a series starts signalling, and not again while the episode lasts", async () => {
    const tomas = (await getViewer(db(), (await db().select().from(users).where(eq(users.email, TECHNICIAN)))[0].id))!;
    const [inst] = await db().select().from(instruments).where(eq(instruments.assetTag, "AVP-AB-06"));
    const count = async () => (await db().select().from(notifications).where(and(eq(notifications.instrumentId, inst.id), eq(notifications.kind, "drift_signal")))).length;
    expect(await count()).toBe(0);
    // +2 mg on a 200 g weight: well within the 0.2 g tolerance of USP <41>, but far beyond 3σ̂ of this balance's history.
    const first = await recordCheck(db(), tomas, { instrument: { assetTag: "AVP-AB-06" }, type: "sensitivity", performedAt: new Date(Date.now() - 120_000), unit: "g", readings: ["200.0020"], source: "form" });
    expect(first.outcome).toBe("in_tolerance");
    expect(first.signals).toContain("nelson-1");
    const afterFirst = await count();
    expect(afterFirst).toBeGreaterThan(0);
    const second = await recordCheck(db(), tomas, { instrument: { assetTag: "AVP-AB-06" }, type: "sensitivity", performedAt: new Date(Date.now() - 60_000), unit: "g", readings: ["200.0021"], source: "form" });
    expect(second.signals.length).toBeGreaterThan(0);
    expect(await count()).toBe(afterFirst);
  });
});
