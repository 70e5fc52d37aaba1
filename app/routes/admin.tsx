import { data, Form } from "react-router";
import { z } from "zod";
import { Button } from "~/components/ui/button";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { ROLE_LABELS } from "~/lib/permissions";
import { listApiTokens, listPeople } from "~/queries/admin.server";
import { createApiToken, revokeApiToken } from "~/queries/people.server";
import type { Route } from "./+types/admin";

export const meta = () => [{ title: "Admin · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireCapability(request, "administer");
  const [people, tokens] = await Promise.all([listPeople(db()), listApiTokens(db())]);
  return { people, tokens };
}

const AdminActionSchema = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("create-token"), userId: z.coerce.number().int().positive(), name: z.string().trim().min(2, "Name the token (what will use it).").max(80) }),
  z.object({ intent: z.literal("revoke-token"), tokenId: z.coerce.number().int().positive() }),
]);

export async function action({ request }: Route.ActionArgs) {
  const viewer = await requireCapability(request, "administer");
  const parsed = AdminActionSchema.safeParse(Object.fromEntries(await request.formData()));
  if (!parsed.success) return data({ error: parsed.error.issues.map((i) => i.message).join(" "), secret: null }, { status: 400 });
  if (parsed.data.intent === "revoke-token") {
    const { tokenId } = parsed.data;
    await db().transaction((tx) => revokeApiToken(tx, { tokenId, actorId: viewer.id }));
    return { error: null, secret: null };
  }
  const { userId, name } = parsed.data;
  const { secret } = await db().transaction((tx) => createApiToken(tx, { userId, name, createdById: viewer.id }));
  return { error: null, secret };
}

export default function Admin({ loaderData, actionData }: Route.ComponentProps) {
  const { people, tokens } = loaderData;
  return (
    <>
      <PageHeader title="Admin" subtitle="People, their roles per site, and API tokens for integrations." />
      <section aria-labelledby="people-heading" className="mb-10">
        <h2 id="people-heading" className="mb-2 text-lg font-semibold">People</h2>
        <table className="w-full max-w-4xl rounded-md border border-rule bg-card text-sm">
          <thead className="border-b border-rule text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2 text-left font-medium">Name</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">E-mail</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">Roles</th>
            </tr>
          </thead>
          <tbody>
            {people.map((p) => (
              <tr key={p.id} className="border-b border-rule/60 last:border-0">
                <td className="px-3 py-2">{p.name}</td>
                <td className="px-3 py-2">{p.email}</td>
                <td className="px-3 py-2">{p.memberships.map((m) => `${ROLE_LABELS[m.role]} at ${m.siteCode}`).join(", ") || "None"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      <section aria-labelledby="tokens-heading">
        <h2 id="tokens-heading" className="mb-2 text-lg font-semibold">API tokens</h2>
        <Form method="post" className="mb-4 flex flex-wrap items-end gap-3 text-sm">
          <input type="hidden" name="intent" value="create-token" />
          <label className="flex flex-col gap-1">
            <span className="text-xs font-medium text-ink-soft">For person</span>
            <select name="userId" className="rounded-md border border-rule bg-card px-2 py-1.5">
              {people.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
            </select>
          </label>
          <label className="flex flex-col gap-1">
            <span className="text-xs font-medium text-ink-soft">Token name</span>
            <input name="name" required placeholder="e.g. LIMS connector" className="rounded-md border border-rule bg-card px-2 py-1.5" />
          </label>
          <Button type="submit">Create token</Button>
        </Form>
        {actionData?.error ? <p role="alert" className="mb-3 text-sm text-out">{actionData.error}</p> : null}
        {actionData?.secret ? (
          <p role="status" className="mb-4 rounded-md border border-accent bg-accent-wash p-3 text-sm">
            Copy this token now; it is shown only once: <code className="break-all font-mono" data-testid="new-token">{actionData.secret}</code>
          </p>
        ) : null}
        <table className="w-full max-w-4xl rounded-md border border-rule bg-card text-sm">
          <thead className="border-b border-rule text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2 text-left font-medium">Person</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">Name</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">Starts with</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">Last used</th>
              <th scope="col" className="px-3 py-2 text-left font-medium">State</th>
            </tr>
          </thead>
          <tbody>
            {tokens.map((t) => (
              <tr key={t.id} className="border-b border-rule/60 last:border-0">
                <td className="px-3 py-2">{t.person}</td>
                <td className="px-3 py-2">{t.name}</td>
                <td className="px-3 py-2 font-mono">{t.prefix}…</td>
                <td className="px-3 py-2">{t.lastUsedAt ? new Date(t.lastUsedAt).toISOString().slice(0, 16).replace("T", " ") + " UTC" : "Never"}</td>
                <td className="px-3 py-2">
                  {t.revokedAt ? (
                    "Revoked"
                  ) : (
                    <Form method="post">
                      <input type="hidden" name="intent" value="revoke-token" />
                      <input type="hidden" name="tokenId" value={t.id} />
                      <button type="submit" className="text-out underline">Revoke</button>
                    </Form>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </>
  );
}
