import { eq } from "drizzle-orm";
import { users } from "../../db/schema";
import type { Database } from "../lib/db.server";
import type { Viewer } from "../lib/permissions";
import { writeAudit } from "./audit.server";

export async function digestPreference(db: Database, userId: number): Promise<boolean> {
  const [row] = await db.select({ on: users.digestsEnabled }).from(users).where(eq(users.id, userId));
  return row?.on ?? false;
}

/** Each person decides for themselves; the choice is audited like any other change. */
export async function setDigestPreference(db: Database, viewer: Viewer, enabled: boolean) {
  await db.transaction(async (tx) => {
    const [before] = await tx.select({ digestsEnabled: users.digestsEnabled }).from(users).where(eq(users.id, viewer.id)).for("update");
    if (before.digestsEnabled === enabled) return;
    await tx.update(users).set({ digestsEnabled: enabled }).where(eq(users.id, viewer.id));
    await writeAudit(tx, { actorId: viewer.id, action: "user.digest_preference", entityType: "user", entityId: String(viewer.id), before, after: { digestsEnabled: enabled } });
  });
}
