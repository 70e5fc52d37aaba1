import { getAuthenticator } from "~/lib/auth.server";
import type { Route } from "./+types/auth-login";

// Starts the authorization-code flow; the strategy answers with a redirect to the identity provider.
export async function loader({ request }: Route.LoaderArgs) {
  const authenticator = await getAuthenticator();
  return authenticator.authenticate("oidc", request);
}
