import { randomBytes } from "node:crypto";
import pg from "pg";
import { describe, expect, inject, it } from "vitest";
import { ensureDatabase, runMigrations } from "../../scripts/lib/database";

const TABLES = [
  "sites", "rooms", "users", "memberships", "instruments", "test_weights", "check_plans", "check_plan_weights", "checks",
  "check_readings", "events", "point_annotations", "series_summaries", "training_records", "imports", "import_rows_rejected",
  "api_tokens", "notifications", "audit_events",
];

describe("migrations", () => {
  it("build the whole data model from an empty database, and a second run changes nothing", async () => {
    const adminUrl = inject("pgAdminUrl");
    const name = `empty_${randomBytes(4).toString("hex")}`;
    await ensureDatabase(adminUrl, name, "tareline_empty");
    const url = adminUrl.replace(/\/postgres$/, `/${name}`);
    await runMigrations(url);
    await runMigrations(url);
    const client = new pg.Client({ connectionString: url });
    await client.connect();
    const tables = await client.query<{ table_name: string }>("select table_name from information_schema.tables where table_schema = 'public'");
    const triggers = await client.query<{ tgname: string }>("select tgname from pg_trigger where tgrelid = 'audit_events'::regclass");
    const index = await client.query("select 1 from pg_indexes where indexname = 'checks_series_idx'");
    const masses = await client.query<{ data_type: string }>("select data_type from information_schema.columns where table_name = 'check_readings' and column_name = 'value'");
    await client.end();
    expect(tables.rows.map((r) => r.table_name)).toEqual(expect.arrayContaining(TABLES));
    expect(triggers.rows.map((r) => r.tgname)).toEqual(expect.arrayContaining(["audit_events_no_update_delete", "audit_events_no_truncate"]));
    expect(index.rowCount).toBe(1);
    expect(masses.rows[0].data_type).toBe("numeric");
  });

  it("stop with an error on a broken database instead of carrying on", async () => {
    await expect(runMigrations("postgres://tareline@127.0.0.1:1/nowhere")).rejects.toThrow();
  });
});
