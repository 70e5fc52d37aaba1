import { spawnSync } from "node:child_process";
import path from "node:path";
import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { writeAudit } from "../../app/queries/audit.server";
import { verifyAuditChain } from "../../app/queries/audit-trail-chain.server";

const root = path.resolve(import.meta.dirname, "../..");

function auditVerify() {
  const run = spawnSync("npm", ["run", "--silent", "audit:verify"], { cwd: root, env: { ...process.env }, encoding: "utf8" });
  return { status: run.status, out: run.stdout + run.stderr };
}

describe("the audit trail is a hash chain", () => {
  it("links every event to the one before it, and audit:verify reports it intact", async () => {
    for (let i = 0; i < 3; i++) await writeAudit(db(), { actorId: null, action: "test.chain", entityType: "test", entityId: String(i), after: { i, note: "ünïcode ✓" } });
    const rows = (await db().execute<{ chain_seq: string; prev_hash: string; hash: string }>(sql`select chain_seq::text, prev_hash, hash from audit_events order by chain_seq`)).rows;
    expect(rows.length).toBeGreaterThanOrEqual(3);
    for (let i = 1; i < rows.length; i++) expect(rows[i].prev_hash).toBe(rows[i - 1].hash);
    expect(await verifyAuditChain(db())).toMatchObject({ ok: true });
    const cli = auditVerify();
    expect(cli.status).toBe(0);
    expect(cli.out).toMatch(/intact/);
  });

  it("keeps concurrent writers in one unbroken chain", async () => {
    await Promise.all(Array.from({ length: 12 }, (_, i) => db().transaction((tx) => writeAudit(tx, { actorId: null, action: "test.concurrent", entityType: "test", entityId: String(i) }))));
    expect(await verifyAuditChain(db())).toMatchObject({ ok: true });
  });

  it("reports the first hand-edited row, made behind the application's back with the append-only trigger disabled", async () => {
    await writeAudit(db(), { actorId: null, action: "test.victim", entityType: "test", entityId: "victim", after: { value: 1 } });
    await writeAudit(db(), { actorId: null, action: "test.after-victim", entityType: "test", entityId: "later" });
    const [victim] = (await db().execute<{ id: string }>(sql`select id::text from audit_events where action = 'test.victim'`)).rows;
    await db().execute(sql`alter table audit_events disable trigger audit_events_no_update_delete`);
    await db().execute(sql`update audit_events set after = '{"value": 2}' where id = ${Number(victim.id)}`);
    await db().execute(sql`alter table audit_events enable trigger audit_events_no_update_delete`);
    const verdict = await verifyAuditChain(db());
    expect(verdict).toMatchObject({ ok: false, brokenAt: { id: Number(victim.id) } });
    const cli = auditVerify();
    expect(cli.status).toBe(1);
    expect(cli.out).toContain(`BROKEN at event id ${victim.id}`);
    expect(cli.out).toMatch(/changed after it was written/);
  });
});
