import { asc, desc, eq } from "drizzle-orm";
import { apiTokens, memberships, sites, users } from "../../db/schema";
import type { Database } from "../lib/db.server";

export async function listPeople(db: Database) {
  const [people, rows] = await Promise.all([
    db.select().from(users).orderBy(asc(users.name)),
    db.select({ userId: memberships.userId, role: memberships.role, siteCode: sites.code }).from(memberships).innerJoin(sites, eq(sites.id, memberships.siteId)),
  ]);
  return people.map((p) => ({ id: p.id, name: p.name, email: p.email, active: p.active, memberships: rows.filter((m) => m.userId === p.id) }));
}

export async function listApiTokens(db: Database) {
  return db
    .select({ id: apiTokens.id, name: apiTokens.name, prefix: apiTokens.prefix, createdAt: apiTokens.createdAt, lastUsedAt: apiTokens.lastUsedAt, revokedAt: apiTokens.revokedAt, person: users.name })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .orderBy(desc(apiTokens.createdAt))
    .limit(200);
}
