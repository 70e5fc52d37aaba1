import type { Route } from "./+types/not-registered";

export const meta = () => [{ title: "Not registered · Tareline" }];

export function loader({ request }: Route.LoaderArgs) {
  return { email: new URL(request.url).searchParams.get("email") ?? "" };
}

export default function NotRegistered({ loaderData }: Route.ComponentProps) {
  return (
    <main className="mx-auto max-w-xl px-6 py-16">
      <h1 className="text-2xl font-semibold">Not registered here</h1>
      <p className="mt-3 text-ink-soft">
        {loaderData.email ? <>The account <strong className="text-ink">{loaderData.email}</strong> signed in correctly, but </> : "Your account signed in correctly, but "}
        it has no access to Tareline. Ask your Tareline administrator to add you to a site with a role. No account was created.
      </p>
      <a href="/login" className="mt-6 inline-block text-accent underline">Back to sign-in</a>
    </main>
  );
}
