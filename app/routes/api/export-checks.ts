import QueryStream from "pg-query-stream";
import { db } from "~/lib/db.server";
import { csvLine } from "~/lib/csv-cell";
import { exportFileName, ExportParamsSchema } from "~/lib/export-params";
import { assertCan, requireApiViewer } from "~/lib/guards.server";
import { problem } from "~/lib/http.server";
import { writeAudit } from "~/queries/audit.server";
import { EXPORT_HEADER, exportCells, exportRowsQuery } from "~/queries/export.server";
import { sites } from "../../../db/schema";
import { eq } from "drizzle-orm";
import type { Route } from "./+types/export-checks";

// Rows go from a database cursor to the response as they come, so memory stays flat whatever the size.
export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  assertCan(viewer, "export_csv");
  const parsed = ExportParamsSchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) return problem(400, "Invalid export filters", parsed.error.issues.map((i) => i.message).join(" "), parsed.error.issues.map((i) => ({ pointer: `/${i.path.join("/")}`, message: i.message })));
  const params = parsed.data;
  const [site] = params.site ? await db().select({ code: sites.code }).from(sites).where(eq(sites.id, params.site)) : [];
  const query = exportRowsQuery(viewer, params);
  const client = await db().$client.connect();
  const rows = client.query(new QueryStream(query.text, query.values, { batchSize: 2000 }));
  // One iterator for the whole response: leaving a for-await loop would close the cursor.
  const iterator = rows[Symbol.asyncIterator]();
  const encoder = new TextEncoder();
  let count = 0;
  let finished = false;
  const finish = async (complete: boolean) => {
    if (finished) return;
    finished = true;
    client.release();
    await writeAudit(db(), { actorId: viewer.id, action: "export.checks", entityType: "export", siteId: params.site ?? null, after: { filters: params, rows: count, complete } });
  };
  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(encoder.encode(`${params.bom ? "\uFEFF" : ""}${csvLine(EXPORT_HEADER)}`));
    },
    async pull(controller) {
      const chunk: string[] = [];
      let done = false;
      while (chunk.length < 1000) {
        const next = await iterator.next();
        if (next.done) {
          done = true;
          break;
        }
        chunk.push(csvLine(exportCells(next.value as Record<string, unknown>)));
        count += 1;
      }
      if (chunk.length) controller.enqueue(encoder.encode(chunk.join("")));
      if (done) {
        controller.close();
        await finish(true);
      }
    },
    async cancel() {
      rows.destroy();
      await finish(false);
    },
  });
  return new Response(body, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="${exportFileName(params, site?.code ?? null)}"`,
      "Cache-Control": "no-store",
    },
  });
}
