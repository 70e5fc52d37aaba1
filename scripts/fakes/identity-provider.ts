// The local OpenID Connect fake: oauth2-mock-server, taught to sign in the demo person named by login_hint.
import { OAuth2Server } from "oauth2-mock-server";
import { demoPersonByEmail } from "../../db/seed/people";

export interface IdentityProviderOptions {
  port: number;
  host?: string;
  /** Extra people the fake may sign in (tests add unregistered ones). */
  extraPeople?: { email: string; name: string }[];
}

export async function startIdentityProvider({ port, host = "127.0.0.1", extraPeople = [] }: IdentityProviderOptions) {
  const server = new OAuth2Server();
  await server.issuer.keys.generate("RS256");
  // Without this the fake announces "localhost" and the issuer would not match our configuration.
  server.issuer.url = `http://${host}:${port}`;
  const personForCode = new Map<string, { email: string; name: string }>();

  server.service.on("beforeAuthorizeRedirect", (redirect: { url: URL }, req: { query: Record<string, unknown> }) => {
    const hint = typeof req.query.login_hint === "string" ? req.query.login_hint.toLowerCase() : "";
    const person = demoPersonByEmail(hint) ?? extraPeople.find((p) => p.email === hint) ?? (hint ? { email: hint, name: hint } : undefined);
    const code = redirect.url.searchParams.get("code");
    if (code && person) personForCode.set(code, person);
  });

  server.service.on("beforeTokenSigning", (token: { payload: Record<string, unknown> }, req: { body?: Record<string, unknown> }) => {
    const code = typeof req.body?.code === "string" ? req.body.code : "";
    const person = personForCode.get(code) ?? { email: "nobody@unknown.test", name: "Unknown person" };
    const demo = demoPersonByEmail(person.email);
    Object.assign(token.payload, {
      sub: `fake|${person.email}`,
      email: person.email,
      email_verified: true,
      name: person.name,
      groups: demo ? [demo.role] : [],
    });
  });

  await server.start(port, host);
  return { issuer: server.issuer.url, stop: () => server.stop() };
}
