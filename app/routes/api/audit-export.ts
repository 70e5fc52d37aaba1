import { db } from "~/lib/db.server";
import { assertCan, requireApiViewer } from "~/lib/guards.server";
import { localDateTime } from "~/lib/schedule";
import { parseSearchParams } from "~/lib/search-params";
import { writeAudit } from "~/queries/audit.server";
import { auditEventBatches, AuditFilterSchema } from "~/queries/audit-trail.server";
import type { Route } from "./+types/audit-export";

const HEADER = ["event_id", "chain_seq", "at_utc", "at_site_local", "site", "actor", "actor_email", "action", "entity_type", "entity_id", "before_json", "after_json", "hash"];

/** RFC 4180 quoting; a cell a spreadsheet would run as a formula is prefixed with an apostrophe. */
function cell(value: unknown): string {
  let text = value === null || value === undefined ? "" : typeof value === "string" ? value : JSON.stringify(value);
  if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

// The export is itself an event of the trail, written before the first byte leaves.
export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  assertCan(viewer, "view_audit");
  const filter = parseSearchParams(AuditFilterSchema, request.url);
  await writeAudit(db(), { actorId: viewer.id, action: "audit.export", entityType: "export", after: { filter } });
  const encoder = new TextEncoder();
  const batches = auditEventBatches(db(), viewer, filter);
  const stream = new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(encoder.encode(`\uFEFF${HEADER.join(",")}\r\n`));
    },
    async pull(controller) {
      const next = await batches.next();
      if (next.done) return controller.close();
      const lines = next.value.map((r) => [r.id, r.chainSeq, r.at.toISOString(), r.timeZone ? localDateTime(r.at, r.timeZone) : "", r.siteCode, r.actorName ?? "System", r.actorEmail, r.action, r.entityType, r.entityId, r.before, r.after, r.hash].map(cell).join(","));
      controller.enqueue(encoder.encode(`${lines.join("\r\n")}\r\n`));
    },
  });
  const stamp = new Date().toISOString().slice(0, 10);
  return new Response(stream, { headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="tareline-audit-${stamp}.csv"`, "Cache-Control": "no-store" } });
}
