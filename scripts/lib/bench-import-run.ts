// The import half of `npm run bench:import`, run as a process of its own so its peak RSS is the importer's alone
// (not the seed's or the generator's). Prints one JSON line with its timings, the import's counts and maxRSS.
// Usage: tsx scripts/lib/bench-import-run.ts <database url> <csv file>
import { createReadStream } from "node:fs";
import { count, desc, eq } from "drizzle-orm";
import { readStoredImport } from "../../app/lib/csv-import-record";
import { suggestMapping } from "../../app/lib/csv-mapping";
import { createDatabase } from "../../app/lib/db.server";
import { startImport, waitForImport } from "../../app/queries/imports-job.server";
import { receiveUpload } from "../../app/queries/imports-upload.server";
import { getViewer } from "../../app/queries/people.server";
import { checks, importRowsRejected, imports, users } from "../../db/schema";
import { DEMO_PEOPLE } from "../../db/seed/people";

const [url, csv] = process.argv.slice(2);
const db = createDatabase(url, 10);
const admin = DEMO_PEOPLE.find((p) => p.role === "admin")!;
const [adminRow] = await db.select().from(users).where(eq(users.email, admin.email));
const viewer = (await getViewer(db, adminRow.id))!;
const rssBefore = process.memoryUsage().rss;

const t0 = performance.now();
const id = await receiveUpload(db, viewer, { filename: "check-history.csv", body: createReadStream(csv) });
const uploadMs = performance.now() - t0;
const [row] = await db.select().from(imports).where(eq(imports.id, id));
const file = readStoredImport(row.mapping).file!;
await startImport(db, viewer, id, { mapping: suggestMapping(file.labels), unit: "g", timeZone: "site", mode: "all_or_nothing", delimiter: file.delimiter, encoding: file.encoding });
let validatedMs = 0;
const peak = { reading: 0, writing: 0 };
const sampler = setInterval(() => {
  const rss = process.memoryUsage().rss;
  if (validatedMs) peak.writing = Math.max(peak.writing, rss);
  else peak.reading = Math.max(peak.reading, rss);
}, 50);
const watch = setInterval(() => {
  void db.select({ status: imports.status }).from(imports).where(eq(imports.id, id)).then(([r]) => {
    if (!validatedMs && r.status === "importing") validatedMs = performance.now() - t0;
  });
}, 100);
await waitForImport(id);
clearInterval(watch);
clearInterval(sampler);
const importMs = performance.now() - t0;

const [done] = await db.select().from(imports).where(eq(imports.id, id));
const [{ written }] = await db.select({ written: count() }).from(checks).where(eq(checks.importId, id));
const reasons = await db.select({ reason: importRowsRejected.reason, n: count() }).from(importRowsRejected).where(eq(importRowsRejected.importId, id)).groupBy(importRowsRejected.reason).orderBy(desc(count())).limit(5);
await db.$client.end();
console.log(JSON.stringify({ uploadMs, validatedMs, importMs, status: done.status, written, rejected: done.rejectedRows, duplicates: done.duplicateRows, reasons, rssBefore, peakReading: peak.reading, peakWriting: peak.writing, maxRss: process.resourceUsage().maxRSS * 1024 }));
