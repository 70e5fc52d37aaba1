import { createHash, randomBytes } from "node:crypto";
import { and, eq, isNull, lt, or } from "drizzle-orm";
import { apiTokens, memberships, users } from "../../db/schema";
import type { DbOrTx } from "../lib/db.server";
import type { Viewer } from "../lib/permissions";
import type { Identity } from "../lib/auth.server";
import { writeAudit } from "./audit.server";

export async function getViewer(db: DbOrTx, userId: number): Promise<Viewer | null> {
  const user = await db.query.users.findFirst({ where: and(eq(users.id, userId), eq(users.active, true)) });
  if (!user) return null;
  const rows = await db.select({ siteId: memberships.siteId, role: memberships.role }).from(memberships).where(eq(memberships.userId, userId));
  return { id: user.id, email: user.email, name: user.name, memberships: rows };
}

/** A registered person is found by subject, or by e-mail on first sign-in (then the subject is bound). */
export async function findUserForIdentity(db: DbOrTx, identity: Identity) {
  const bySubject = identity.subject ? await db.query.users.findFirst({ where: eq(users.subject, identity.subject) }) : undefined;
  if (bySubject) return bySubject.active ? bySubject : null;
  const byEmail = await db.query.users.findFirst({ where: eq(users.email, identity.email) });
  if (!byEmail || !byEmail.active || (byEmail.subject && byEmail.subject !== identity.subject)) return null;
  if (!byEmail.subject && identity.subject) await db.update(users).set({ subject: identity.subject }).where(eq(users.id, byEmail.id));
  return byEmail;
}

export const hashToken = (secret: string) => createHash("sha256").update(secret).digest("hex");

/** Issues a token for `userId`; the secret is returned once and only its hash is stored. */
export async function createApiToken(db: DbOrTx, params: { userId: number; name: string; createdById: number | null }) {
  const secret = `tl_${randomBytes(24).toString("base64url")}`;
  const [row] = await db
    .insert(apiTokens)
    .values({ userId: params.userId, name: params.name, tokenHash: hashToken(secret), prefix: secret.slice(0, 9), createdById: params.createdById })
    .returning();
  await writeAudit(db, { actorId: params.createdById, action: "api_token.create", entityType: "api_token", entityId: String(row.id), after: { userId: row.userId, name: row.name, prefix: row.prefix } });
  return { token: row, secret };
}

export async function revokeApiToken(db: DbOrTx, params: { tokenId: number; actorId: number }) {
  const [row] = await db.update(apiTokens).set({ revokedAt: new Date() }).where(and(eq(apiTokens.id, params.tokenId), isNull(apiTokens.revokedAt))).returning();
  if (row) await writeAudit(db, { actorId: params.actorId, action: "api_token.revoke", entityType: "api_token", entityId: String(row.id), before: { revokedAt: null }, after: { revokedAt: row.revokedAt } });
  return row ?? null;
}

/**
 * "Last used" is kept to the minute: a read looks the token up, and only the first use in a minute writes. A write
 * (and its commit to disk) on every API request cost more than many a request itself.
 */
export async function userIdForToken(db: DbOrTx, secret: string): Promise<number | null> {
  const [row] = await db
    .select({ id: apiTokens.id, userId: apiTokens.userId, lastUsedAt: apiTokens.lastUsedAt })
    .from(apiTokens)
    .where(and(eq(apiTokens.tokenHash, hashToken(secret)), isNull(apiTokens.revokedAt)));
  if (!row) return null;
  const now = new Date();
  if (!row.lastUsedAt || now.getTime() - row.lastUsedAt.getTime() >= 60_000) {
    await db.update(apiTokens).set({ lastUsedAt: now }).where(and(eq(apiTokens.id, row.id), or(isNull(apiTokens.lastUsedAt), lt(apiTokens.lastUsedAt, new Date(now.getTime() - 60_000)))));
  }
  return row.userId;
}
