import { Link, redirect } from "react-router";
import { DEMO_PEOPLE } from "../../db/seed/people";
import { env } from "~/lib/env.server";
import { getOptionalViewer } from "~/lib/guards.server";
import { ROLE_LABELS } from "~/lib/permissions";
import type { Route } from "./+types/login";

export const meta = () => [{ title: "Sign in · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  if (await getOptionalViewer(request)) return redirect("/");
  const url = new URL(request.url);
  const demo = env().DEMO_SIGN_IN === "true" ? DEMO_PEOPLE.map(({ email, name, role, siteCodes }) => ({ email, name, role, siteCodes })) : [];
  return { demo, signedOut: url.searchParams.has("signedOut") };
}

export default function Login({ loaderData }: Route.ComponentProps) {
  return (
    <main className="mx-auto flex min-h-screen max-w-3xl flex-col justify-center px-6 py-12">
      <p className="text-sm font-semibold uppercase tracking-[0.2em] text-accent">Tareline</p>
      <h1 className="mt-2 text-3xl font-semibold tracking-tight">Routine checks for balances and scales</h1>
      {loaderData.signedOut ? <p role="status" className="mt-4 text-ink-soft">You have signed out.</p> : null}
      <a href="/auth/login" className="mt-8 inline-flex w-fit rounded-md bg-accent px-5 py-2.5 font-medium text-paper hover:bg-accent-deep">
        Sign in with your organisation account
      </a>
      {loaderData.demo.length ? (
        <section className="mt-12" aria-labelledby="demo-heading">
          <h2 id="demo-heading" className="text-lg font-semibold">Demo people (development only)</h2>
          <p className="mt-1 text-sm text-ink-soft">Each signs in through the local identity-provider fake.</p>
          <ul className="mt-4 grid gap-2 sm:grid-cols-2">
            {loaderData.demo.map((person) => (
              <li key={person.email}>
                <Link
                  to={`/auth/login?login_hint=${encodeURIComponent(person.email)}`}
                  reloadDocument
                  className="block rounded-md border border-rule bg-card px-4 py-3 hover:border-accent"
                >
                  <span className="block font-medium">{person.name}</span>
                  <span className="block text-sm text-ink-soft">
                    {ROLE_LABELS[person.role]} · {person.siteCodes.join(", ")}
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </main>
  );
}
