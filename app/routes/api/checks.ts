import { and, asc, eq, gt, gte, lte, or, inArray, type SQL } from "drizzle-orm";
import { z } from "zod";
import { parseCheckRequest } from "~/lib/check-request";
import { db } from "~/lib/db.server";
import { CheckRefused } from "~/lib/domain-errors";
import { requireApiViewer } from "~/lib/guards.server";
import { problem } from "~/lib/http.server";
import { sendMail } from "~/lib/mail.server";
import { visibleSiteIds } from "~/lib/permissions";
import { deliverNotifications } from "~/queries/consequences.server";
import { recordCheck } from "~/queries/checks.server";
import { checks, instruments, users } from "../../../db/schema";
import { CHECK_TYPES } from "../../../db/schema/enums";
import type { Route } from "./+types/checks";

const MAX_BODY = 256 * 1024;

export async function action({ request }: Route.ActionArgs) {
  const viewer = await requireApiViewer(request);
  if (request.method !== "POST") return problem(405, "Method not allowed", "POST a check as JSON.");
  const key = request.headers.get("Idempotency-Key")?.trim() || null;
  if (key && key.length > 200) return problem(400, "Idempotency-Key too long", "Keep the key under 200 characters.");
  const text = await request.text();
  if (text.length > MAX_BODY) return problem(413, "Body too large", "A check is at most 256 KB of JSON.");
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    return problem(400, "Body is not JSON", "Send the check as a JSON object.", [{ pointer: "", message: "Not valid JSON." }]);
  }
  const parsed = parseCheckRequest(body);
  if (!parsed.ok) return problem(422, "Invalid check", parsed.problems.map((p) => p.message).join(" "), parsed.problems);
  const input = parsed.value;
  try {
    const recorded = await recordCheck(db(), viewer, {
      instrument: { assetTag: input.instrument },
      type: input.type,
      performedAt: new Date(input.performedAt),
      unit: input.unit,
      weight: input.weight ?? null,
      readings: input.readings,
      note: input.note,
      source: "api",
      idempotencyKey: key,
    });
    await deliverNotifications(db(), recorded.notificationIds, sendMail);
    const { notificationIds: _ids, replayed, ...answer } = recorded;
    return Response.json(answer, { status: replayed ? 200 : 201, headers: { Location: `/api/v1/checks/${recorded.id}` } });
  } catch (error) {
    if (error instanceof CheckRefused) return problem(error.status, error.title, error.message, error.problems);
    throw error;
  }
}

const ListParamsSchema = z.object({
  instrument: z.string().trim().min(1).optional(),
  type: z.enum(CHECK_TYPES).optional(),
  from: z.iso.datetime({ offset: true }).optional(),
  to: z.iso.datetime({ offset: true }).optional(),
  limit: z.coerce.number().int().min(1).max(1000).default(100),
  cursor: z.string().regex(/^\d+:\d+$/, "cursor is the nextCursor of the previous page.").optional(),
});

/** Oldest first, keyset-paginated on (performed_at, id) so pages stay stable while checks arrive. */
export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  const parsed = ListParamsSchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) return problem(400, "Invalid query", parsed.error.issues.map((i) => i.message).join(" "), parsed.error.issues.map((i) => ({ pointer: `/${i.path.join("/")}`, message: i.message })));
  const p = parsed.data;
  const ids = visibleSiteIds(viewer);
  const conditions: (SQL | undefined)[] = [
    ids === null ? undefined : inArray(instruments.siteId, ids.length ? ids : [-1]),
    p.instrument ? eq(instruments.assetTag, p.instrument) : undefined,
    p.type ? eq(checks.checkType, p.type) : undefined,
    p.from ? gte(checks.performedAt, new Date(p.from)) : undefined,
    p.to ? lte(checks.performedAt, new Date(p.to)) : undefined,
  ];
  if (p.cursor) {
    const [ms, id] = p.cursor.split(":").map(Number);
    const at = new Date(ms);
    conditions.push(or(gt(checks.performedAt, at), and(eq(checks.performedAt, at), gt(checks.id, id))));
  }
  const rows = await db()
    .select({ id: checks.id, instrument: instruments.assetTag, type: checks.checkType, performedAt: checks.performedAt, outcome: checks.outcome, resultG: checks.resultG, toleranceG: checks.toleranceG, acceptanceG: checks.acceptanceG, expandedUncertaintyG: checks.expandedUncertaintyG, source: checks.source, operator: users.name })
    .from(checks)
    .innerJoin(instruments, eq(instruments.id, checks.instrumentId))
    .innerJoin(users, eq(users.id, checks.operatorId))
    .where(and(...conditions))
    .orderBy(asc(checks.performedAt), asc(checks.id))
    .limit(p.limit + 1);
  const page = rows.slice(0, p.limit);
  const last = page.at(-1);
  return Response.json({ checks: page, nextCursor: rows.length > p.limit && last ? `${last.performedAt.getTime()}:${last.id}` : null });
}
