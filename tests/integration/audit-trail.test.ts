import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { writeAudit } from "../../app/queries/audit.server";

// Drizzle wraps the driver's error; the database's own message is its cause.
async function databaseError(promise: Promise<unknown>): Promise<string> {
  const error = await promise.then(() => null, (e: unknown) => e as Error & { cause?: Error });
  return error ? String(error.cause?.message ?? error.message) : "no error";
}

describe("audit events are append-only", () => {
  it("accept inserts and refuse UPDATE, DELETE and TRUNCATE at the database", async () => {
    await writeAudit(db(), { actorId: null, action: "test.insert", entityType: "test", entityId: "1" });
    expect(await databaseError(db().execute(sql`update audit_events set action = 'tampered'`))).toMatch(/append-only/);
    expect(await databaseError(db().execute(sql`delete from audit_events`))).toMatch(/append-only/);
    expect(await databaseError(db().execute(sql`truncate audit_events`))).toMatch(/append-only/);
    const rows = await db().execute(sql`select count(*)::int as n from audit_events where action = 'test.insert'`);
    expect(rows.rows[0]).toEqual({ n: 1 });
  });
});
