import { auditEvents } from "../../db/schema";
import type { DbOrTx } from "../lib/db.server";

export interface AuditInput {
  actorId: number | null;
  action: string;
  entityType: string;
  entityId?: string | null;
  siteId?: number | null;
  before?: unknown;
  after?: unknown;
}

/** Call inside the transaction of the change it records, so both land or neither does. */
export async function writeAudit(db: DbOrTx, event: AuditInput): Promise<void> {
  await db.insert(auditEvents).values({
    actorId: event.actorId,
    action: event.action,
    entityType: event.entityType,
    entityId: event.entityId ?? null,
    siteId: event.siteId ?? null,
    before: event.before ?? null,
    after: event.after ?? null,
  });
}
