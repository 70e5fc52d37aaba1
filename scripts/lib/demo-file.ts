// .data/demo.json: the demo people and one API token each, so a script can call the API at once.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { and, eq, inArray, isNull } from "drizzle-orm";
import type { Database } from "../../app/lib/db.server";
import { createApiToken, hashToken } from "../../app/queries/people.server";
import { apiTokens, users } from "../../db/schema";
import { DEMO_PEOPLE } from "../../db/seed/people";

interface DemoFile {
  url: string;
  people: { name: string; email: string; role: string; sites: string[]; apiToken: string }[];
}

const TOKEN_NAME = "demo (development only)";

/** Keeps the file's tokens if they still work; otherwise revokes the old demo tokens and issues new ones. */
export async function writeDemoFile(db: Database, file: string, appUrl: string): Promise<DemoFile> {
  if (existsSync(file)) {
    const current = JSON.parse(readFileSync(file, "utf8")) as DemoFile;
    const hashes = current.people.map((p) => hashToken(p.apiToken));
    const live = await db.select({ id: apiTokens.id }).from(apiTokens).where(and(inArray(apiTokens.tokenHash, hashes), isNull(apiTokens.revokedAt)));
    if (live.length === DEMO_PEOPLE.length && current.people.length === DEMO_PEOPLE.length) return current;
  }
  const people = await db.transaction(async (tx) => {
    const out: DemoFile["people"] = [];
    for (const person of DEMO_PEOPLE) {
      const [user] = await tx.select().from(users).where(eq(users.email, person.email));
      if (!user) continue;
      await tx.update(apiTokens).set({ revokedAt: new Date() }).where(and(eq(apiTokens.userId, user.id), eq(apiTokens.name, TOKEN_NAME), isNull(apiTokens.revokedAt)));
      const { secret } = await createApiToken(tx, { userId: user.id, name: TOKEN_NAME, createdById: null });
      out.push({ name: person.name, email: person.email, role: person.role, sites: person.siteCodes, apiToken: secret });
    }
    return out;
  });
  const content: DemoFile = { url: appUrl, people };
  mkdirSync(path.dirname(file), { recursive: true });
  writeFileSync(file, `${JSON.stringify(content, null, 2)}\n`, { mode: 0o600 });
  return content;
}
