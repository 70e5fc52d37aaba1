import { redirect } from "react-router";
import { getAuthenticator } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { getSession, sessionStorage } from "~/lib/session.server";
import { writeAudit } from "~/queries/audit.server";
import { findUserForIdentity } from "~/queries/people.server";
import type { Route } from "./+types/auth-callback";

export async function loader({ request }: Route.LoaderArgs) {
  const authenticator = await getAuthenticator();
  const identity = await authenticator.authenticate("oidc", request);
  const user = await db().transaction(async (tx) => {
    const found = await findUserForIdentity(tx, identity);
    if (found) await writeAudit(tx, { actorId: found.id, action: "session.sign_in", entityType: "user", entityId: String(found.id) });
    return found;
  });
  // Nobody is created on the fly: a person must be registered by an administrator first.
  if (!user) return redirect(`/not-registered?email=${encodeURIComponent(identity.email)}`);
  const session = await getSession(request);
  session.set("userId", user.id);
  return redirect("/", { headers: { "Set-Cookie": await sessionStorage().commitSession(session) } });
}
