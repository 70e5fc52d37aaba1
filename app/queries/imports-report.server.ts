// The rejected-rows report: written in batches while the file is read (it is kept even when nothing is
// imported), and streamed back as a spreadsheet-safe CSV.
import { Readable, Transform } from "node:stream";
import QueryStream from "pg-query-stream";
import { importRowsRejected } from "../../db/schema";
import { csvLine } from "../lib/csv-cell";
import type { RowProblem } from "../lib/csv-row";
import type { Database } from "../lib/db.server";

const BATCH = 500;

export class RejectionWriter {
  rows = 0;
  private batch: RowProblem[] = [];

  constructor(
    private readonly db: Database,
    private readonly importId: number,
  ) {}

  /** Records the problems of one rejected line. */
  async add(problems: RowProblem[]): Promise<void> {
    this.rows++;
    this.batch.push(...problems);
    if (this.batch.length >= BATCH) await this.flush();
  }

  async flush(): Promise<void> {
    if (!this.batch.length) return;
    const rows = this.batch.map((p) => ({ importId: this.importId, line: p.line, column: p.column, reason: p.reason, raw: p.raw }));
    this.batch = [];
    await this.db.insert(importRowsRejected).values(rows);
  }
}

interface ReportRow {
  line: number;
  column: string | null;
  reason: string;
  raw: string | null;
}

/** The report as CSV, read through a cursor so a report of a million lines never sits in memory. */
export async function reportStream(db: Database, importId: number): Promise<ReadableStream<Uint8Array>> {
  const client = await db.$client.connect();
  const rows = client.query(new QueryStream('SELECT line, "column", reason, raw FROM import_rows_rejected WHERE import_id = $1 ORDER BY line', [importId], { batchSize: 2000 }));
  let released = false;
  const release = (error?: Error) => {
    if (released) return;
    released = true;
    client.release(error);
  };
  const toCsv = new Transform({
    writableObjectMode: true,
    transform(row: ReportRow, _enc, done) {
      done(null, csvLine([row.line, row.column, row.reason, row.raw]));
    },
  });
  toCsv.push(csvLine(["line", "column", "reason", "raw"]));
  rows.on("error", (error) => {
    release(error);
    toCsv.destroy(error);
  });
  rows.on("end", () => release());
  toCsv.on("close", () => {
    if (!released) rows.destroy();
    release();
  });
  return Readable.toWeb(rows.pipe(toCsv)) as ReadableStream<Uint8Array>;
}
