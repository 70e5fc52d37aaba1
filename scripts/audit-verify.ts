// `npm run audit:verify`: recomputes the audit trail's hash chain and names the first broken link (exit 1), if any.
import { createDatabase } from "../app/lib/db.server";
import { verifyAuditChain } from "../app/queries/audit-trail-chain.server";

const url = process.env.DATABASE_URL ?? "postgres://tareline@127.0.0.1:54329/tareline";
const db = createDatabase(url, 1);
try {
  const verdict = await verifyAuditChain(db);
  if (verdict.ok) {
    console.log(`Audit trail intact: ${verdict.events} event(s), every link verified.`);
  } else {
    console.log(`Audit trail BROKEN at event id ${verdict.brokenAt.id} (chain position ${verdict.brokenAt.chainSeq ?? "none"}): ${verdict.problem}.`);
    console.log(`${verdict.events} event(s) before it verified.`);
    process.exitCode = 1;
  }
} catch (error) {
  console.error(`Could not verify the audit trail: ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 2;
} finally {
  await db.$client.end();
}
