// The export is written by PostgreSQL's COPY from the readings' copy kept on each check: that copy must always agree
// with check_readings, stay unchangeable, and the file must keep RFC 4180's record ends and every typed character.
import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { recordCheck } from "../../app/queries/checks.server";
import { getViewer } from "../../app/queries/people.server";
import * as exportCsv from "../../app/routes/api/export-checks";
import { checks, users } from "../../db/schema";
import { ANALYST, TECHNICIAN } from "../helpers/people";
import { cookieFor, request, run } from "../helpers/routes";

let analyst = "";
beforeAll(async () => {
  analyst = await cookieFor(ANALYST);
});

const technician = async () => (await getViewer(db(), (await db().select().from(users).where(eq(users.email, TECHNICIAN)))[0].id))!;

/** Checks whose stored readings text is not what check_readings says. */
async function disagreeing() {
  const result = await db().execute<{ n: number }>(sql`
    select count(*)::int as n from checks c
    where c.readings_entered is distinct from (
      select readings_as_entered(array_agg(r.value order by r.ordinal), array_agg(r.position::text order by r.ordinal))
      from check_readings r where r.check_id = c.id)`);
  return result.rows[0].n;
}

describe("the readings kept on each check", () => {
  it("agree with check_readings for the whole seeded history and for new checks of every type", async () => {
    const tomas = await technician();
    const now = Date.now();
    await recordCheck(db(), tomas, { instrument: { assetTag: "AVP-AB-04" }, type: "sensitivity", performedAt: new Date(now - 180_000), unit: "g", readings: ["200.0001", "200.0000"], source: "form" });
    const eccentricity = await recordCheck(db(), tomas, { instrument: { assetTag: "AVP-AB-04" }, type: "eccentricity", performedAt: new Date(now - 120_000), unit: "g", readings: { centre: "200.0000", "front-left": "200.0002", "back-left": "199.9999", "back-right": "200.0001", "front-right": "200.0003" }, source: "form" });
    const [row] = await db().select({ text: checks.readingsEntered }).from(checks).where(eq(checks.id, eccentricity.id));
    expect(row.text).toMatch(/^centre=200\.0000 front-left=200\.0002 back-left=199\.9999 /);
    expect(await disagreeing()).toBe(0);
  });

  it("cannot be changed once written, like the readings themselves", async () => {
    const [first] = await db().select({ id: checks.id }).from(checks).limit(1);
    await expect(db().execute(sql`update checks set readings_entered = '1' where id = ${first.id}`)).rejects.toMatchObject({ cause: { message: expect.stringMatching(/never overwritten/) } });
  });
});

describe("GET /api/v1/export/checks.csv written by COPY", () => {
  it("ends records with CRLF, keeps a two-line note inside its quotes, and audits the true row count", async () => {
    const tomas = await technician();
    const check = await recordCheck(db(), tomas, { instrument: { assetTag: "AVP-PB-01" }, type: "sensitivity", performedAt: new Date(Date.now() - 60_000), unit: "g", readings: ["5000.00"], note: 'Draft shield open;\nsaid "retry"', source: "form" });
    // The Response's own bytes: text() would drop the byte-order mark.
    const response = (await exportCsv.loader({ request: request("/api/v1/export/checks.csv?instrument=AVP-PB-01&type=sensitivity&bom=1", { cookie: analyst }), params: {}, context: {} } as never)) as Response;
    const bytes = new Uint8Array(await response.arrayBuffer());
    expect([...bytes.slice(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const text = new TextDecoder("utf-8", { ignoreBOM: true }).decode(bytes).slice(1);
    expect(text.startsWith("check_id,")).toBe(true);
    expect(text).toContain(`${check.id},AVP-PB-01,AVP,sensitivity,`);
    expect(text).toContain(`,"Draft shield open;\nsaid ""retry"""\r\n`);
    expect(text.replaceAll("\r\n", "").includes("\n")).toBe(true);
    const records = text.split("\r\n").length - 2;
    const [audit] = await db().execute<{ after: { rows: number } }>(sql`select after from audit_events where action = 'export.checks' order by id desc limit 1`).then((r) => r.rows);
    expect(audit.after.rows).toBe(records);
  });

  it("treats a filter value as text, never as SQL, even when it looks like a placeholder or a quote", async () => {
    for (const instrument of ["$1", "x' or '1'='1", "AVP-PB-01$2"]) {
      const result = await run(exportCsv.loader, request(`/api/v1/export/checks.csv?instrument=${encodeURIComponent(instrument)}`, { cookie: analyst }));
      expect(result.status).toBe(200);
      expect(String(result.body).trim().split("\r\n")).toHaveLength(1);
    }
  });
});
