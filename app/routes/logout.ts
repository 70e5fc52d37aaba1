import { redirect } from "react-router";
import { getSession, sessionStorage } from "~/lib/session.server";
import type { Route } from "./+types/logout";

export async function action({ request }: Route.ActionArgs) {
  const session = await getSession(request);
  return redirect("/login?signedOut=1", { headers: { "Set-Cookie": await sessionStorage().destroySession(session) } });
}

export async function loader() {
  return redirect("/");
}
