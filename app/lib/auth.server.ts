// Sign-in through any OpenID Connect provider (authorization code + PKCE), configured by environment.
import { Authenticator } from "remix-auth";
import { OAuth2Strategy } from "remix-auth-oauth2";
import { env } from "./env.server";

export interface Identity {
  subject: string;
  email: string;
  name: string;
}

/** Passes `login_hint` from /auth/login?login_hint=… on to the identity provider. */
class OidcStrategy extends OAuth2Strategy<Identity> {
  override name = "oidc";
  protected override authorizationParams(params: URLSearchParams, request: Request): URLSearchParams {
    const hint = new URL(request.url).searchParams.get("login_hint");
    if (hint) params.set("login_hint", hint);
    return params;
  }
}

function claimsOf(idToken: string): Record<string, unknown> {
  const payload = idToken.split(".")[1] ?? "";
  return JSON.parse(Buffer.from(payload, "base64url").toString("utf8"));
}

let authenticator: Promise<Authenticator<Identity>> | undefined;

export function getAuthenticator(): Promise<Authenticator<Identity>> {
  authenticator ??= (async () => {
    const config = env();
    const strategy = await OidcStrategy.discover<Identity, OidcStrategy>(
      config.OIDC_ISSUER,
      {
        clientId: config.OIDC_CLIENT_ID,
        clientSecret: config.OIDC_CLIENT_SECRET,
        redirectURI: config.OIDC_REDIRECT_URI,
        scopes: ["openid", "email", "profile"],
        cookie: { name: "__tareline_oidc", httpOnly: true, sameSite: "Lax", path: "/", ...(config.APP_URL.startsWith("https://") ? { secure: true as const } : {}) },
      },
      // The ID token comes straight from the token endpoint over the back channel (OIDC Core §3.1.3.7).
      async ({ tokens }) => {
        const claims = claimsOf(tokens.idToken());
        const email = typeof claims.email === "string" ? claims.email.toLowerCase() : "";
        return { subject: String(claims.sub ?? ""), email, name: typeof claims.name === "string" ? claims.name : email };
      },
    );
    return new Authenticator<Identity>().use(strategy);
  })().catch((error: unknown) => {
    authenticator = undefined;
    throw error;
  });
  return authenticator;
}
