import { to as copyTo } from "pg-copy-streams";
import { eq } from "drizzle-orm";
import { db } from "~/lib/db.server";
import { csvLine } from "~/lib/csv-cell";
import { CsvRecordEnds } from "~/lib/csv-record-ends";
import { exportFileName, ExportParamsSchema } from "~/lib/export-params";
import { assertCan, requireApiViewer } from "~/lib/guards.server";
import { problem } from "~/lib/http.server";
import { writeAudit } from "~/queries/audit.server";
import { EXPORT_HEADER, exportCopyStatement } from "~/queries/export.server";
import { sites } from "../../../db/schema";
import type { Route } from "./+types/export-checks";

// PostgreSQL writes the CSV (COPY … TO STDOUT) and the bytes go to the response as they come: memory stays flat
// whatever the size, and the app adds only the record ends RFC 4180 asks for.
export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  assertCan(viewer, "export_csv");
  const parsed = ExportParamsSchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) return problem(400, "Invalid export filters", parsed.error.issues.map((i) => i.message).join(" "), parsed.error.issues.map((i) => ({ pointer: `/${i.path.join("/")}`, message: i.message })));
  const params = parsed.data;
  const [site] = params.site ? await db().select({ code: sites.code }).from(sites).where(eq(sites.id, params.site)) : [];
  const client = await db().$client.connect();
  const copy = client.query(copyTo(exportCopyStatement(viewer, params, (v) => client.escapeLiteral(v))));
  const records = new CsvRecordEnds();
  copy.on("error", (error) => records.destroy(error));
  copy.pipe(records);

  async function* body() {
    let complete = false;
    try {
      yield Buffer.from(`${params.bom ? "\uFEFF" : ""}${csvLine(EXPORT_HEADER)}`);
      for await (const chunk of records) yield chunk as Buffer;
      complete = true;
    } finally {
      // A COPY stopped half-way leaves the connection mid-protocol: discard it rather than return it to the pool.
      if (!complete) copy.destroy();
      client.release(complete ? undefined : true);
      await writeAudit(db(), { actorId: viewer.id, action: "export.checks", entityType: "export", siteId: params.site ?? null, after: { filters: params, rows: records.records, complete } });
    }
  }

  const chunks = body();
  const stream = new ReadableStream<Uint8Array>({
    async pull(controller) {
      const next = await chunks.next();
      if (next.done) controller.close();
      else controller.enqueue(next.value);
    },
    // The browser went away: the generator's finally discards the half-read COPY and writes the audit event.
    async cancel() {
      await chunks.return(undefined);
    },
  });
  return new Response(stream, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="${exportFileName(params, site?.code ?? null)}"`,
      "Cache-Control": "no-store",
    },
  });
}
