import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { createApiToken, revokeApiToken } from "../../app/queries/people.server";
import * as apiInstrument from "../../app/routes/api/instrument";
import * as apiInstruments from "../../app/routes/api/instruments";
import * as apiMe from "../../app/routes/api/me";
import { instruments, sites, users } from "../../db/schema";
import { METROLOGIST, TECHNICIAN } from "../helpers/people";
import { cookieFor, request, run } from "../helpers/routes";

async function tokenFor(email: string) {
  const [user] = await db().select().from(users).where(eq(users.email, email));
  return db().transaction((tx) => createApiToken(tx, { userId: user.id, name: "test", createdById: null }));
}

describe("API authentication", () => {
  it("answers 401 as problem+json without credentials, never a redirect", async () => {
    const result = await run(apiInstruments.loader, request("/api/v1/instruments"));
    expect(result.status).toBe(401);
    expect(result.headers.get("Content-Type")).toBe("application/problem+json");
    expect(result.body).toMatchObject({ status: 401, title: "Unauthorized" });
  });

  it("accepts a bearer token scoped to its person, and the session cookie", async () => {
    const { secret } = await tokenFor(TECHNICIAN);
    const me = await run(apiMe.loader, request("/api/v1/me", { headers: { Authorization: `Bearer ${secret}` } }));
    expect(me.status).toBe(200);
    expect(me.body).toMatchObject({ email: TECHNICIAN });
    const viaCookie = await run(apiMe.loader, request("/api/v1/me", { cookie: await cookieFor(METROLOGIST) }));
    expect(viaCookie.body).toMatchObject({ email: METROLOGIST });
  });

  it("answers 401 for a revoked or unknown token", async () => {
    const { secret, token } = await tokenFor(TECHNICIAN);
    await revokeApiToken(db(), { tokenId: token.id, actorId: token.userId });
    const revoked = await run(apiMe.loader, request("/api/v1/me", { headers: { Authorization: `Bearer ${secret}` } }));
    expect(revoked.status).toBe(401);
    expect(revoked.headers.get("Content-Type")).toBe("application/problem+json");
    const unknown = await run(apiMe.loader, request("/api/v1/me", { headers: { Authorization: "Bearer tl_not-a-real-token" } }));
    expect(unknown.status).toBe(401);
  });

  it("applies the token person's site rules: another site's instrument is a 404 problem", async () => {
    const { secret } = await tokenFor(TECHNICIAN);
    const [lnt] = await db().select({ id: instruments.id }).from(instruments).innerJoin(sites, eq(sites.id, instruments.siteId)).where(eq(sites.code, "LNT")).limit(1);
    const result = await run(apiInstrument.loader, request(`/api/v1/instruments/${lnt.id}`, { headers: { Authorization: `Bearer ${secret}` } }), { id: String(lnt.id) });
    expect(result.status).toBe(404);
    expect(result.headers.get("Content-Type")).toBe("application/problem+json");
  });

  it("stores only the token's hash", async () => {
    const { secret, token } = await tokenFor(TECHNICIAN);
    expect(token.tokenHash).not.toContain(secret);
    expect(token.tokenHash).toMatch(/^[0-9a-f]{64}$/);
  });
});
