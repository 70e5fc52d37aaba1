// Recomputes the audit hash chain outside the database, so a trigger or function altered in the database cannot
// vouch for itself. The payload mirrors audit_events_hash() in db/migrations/0005_audit_chain_and_check_corrections.sql.
import { createHash } from "node:crypto";
import { sql } from "drizzle-orm";
import type { DbOrTx } from "../lib/db.server";

const GENESIS = "0".repeat(64);
const BATCH = 5_000;

type ChainRow = {
  id: string;
  chain_seq: string | null;
  prev_hash: string | null;
  hash: string | null;
  at_utc: string;
  actor_id: string | null;
  action: string;
  entity_type: string;
  entity_id: string | null;
  site_id: string | null;
  before: string | null;
  after: string | null;
};

export type ChainVerdict =
  | { ok: true; events: number }
  | { ok: false; events: number; brokenAt: { id: number; chainSeq: number | null }; problem: string };

const field = (value: string | null) => (value === null ? "-" : `${Buffer.byteLength(value, "utf8")}:${value}`);

export function eventHash(row: Omit<ChainRow, "id" | "hash" | "chain_seq"> & { chain_seq: string }): string {
  const payload = [row.chain_seq, row.prev_hash, row.at_utc, row.actor_id, row.action, row.entity_type, row.entity_id, row.site_id, row.before, row.after].map(field).join("|");
  return createHash("sha256").update(payload, "utf8").digest("hex");
}

/** Walks the chain in order and reports the first event whose hash, link or position does not hold. */
export async function verifyAuditChain(db: DbOrTx): Promise<ChainVerdict> {
  let expectedPrev = GENESIS;
  let expectedSeq = 1;
  let events = 0;
  let after = 0;
  const [{ unchained }] = (await db.execute<{ unchained: string }>(sql`select count(*)::text as unchained from audit_events where chain_seq is null`)).rows;
  for (;;) {
    const { rows } = await db.execute<ChainRow>(sql`
      select id::text, chain_seq::text, prev_hash, hash, to_char(at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"') as at_utc,
             actor_id::text, action, entity_type, entity_id, site_id::text, before::text, after::text
      from audit_events where audit_events.chain_seq > ${after} order by audit_events.chain_seq limit ${BATCH}`);
    if (rows.length === 0) break;
    for (const row of rows) {
      const broken = (problem: string): ChainVerdict => ({ ok: false, events, brokenAt: { id: Number(row.id), chainSeq: row.chain_seq === null ? null : Number(row.chain_seq) }, problem });
      if (Number(row.chain_seq) !== expectedSeq) return broken(`position ${row.chain_seq} follows ${expectedSeq - 1}: an event is missing before it`);
      if (row.prev_hash !== expectedPrev) return broken("its link to the previous event does not match that event's hash");
      if (eventHash({ ...row, chain_seq: row.chain_seq! }) !== row.hash) return broken("its content no longer matches its hash: it was changed after it was written");
      expectedPrev = row.hash!;
      expectedSeq++;
      events++;
    }
    after = Number(rows.at(-1)!.chain_seq);
  }
  if (Number(unchained) > 0) {
    const [first] = (await db.execute<{ id: string }>(sql`select id::text from audit_events where chain_seq is null order by id limit 1`)).rows;
    return { ok: false, events, brokenAt: { id: Number(first.id), chainSeq: null }, problem: `${unchained} event(s) carry no chain position: they were written with the chain trigger disabled` };
  }
  return { ok: true, events };
}
