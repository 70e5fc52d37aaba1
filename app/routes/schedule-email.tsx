import { Form, useSearchParams } from "react-router";
import { redirect } from "react-router";
import { Button } from "~/components/ui/button";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { digestPreference, setDigestPreference } from "~/queries/schedule-email.server";
import type { Route } from "./+types/schedule-email";

export const meta = () => [{ title: "E-mail digests · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  return { enabled: await digestPreference(db(), viewer.id), email: viewer.email };
}

export async function action({ request }: Route.ActionArgs) {
  const viewer = await requireViewer(request);
  const form = await request.formData();
  await setDigestPreference(db(), viewer, form.get("enabled") === "on");
  return redirect("/schedule/email?saved=1");
}

export default function EmailSettings({ loaderData }: Route.ComponentProps) {
  const [search] = useSearchParams();
  return (
    <>
      <PageHeader title="E-mail digests" subtitle={`Sent to ${loaderData.email}.`} />
      {search.get("saved") ? <p role="status" className="mb-4 max-w-2xl rounded-md border border-rule bg-card p-3 text-sm">Saved.</p> : null}
      <Form method="post" className="grid max-w-2xl gap-4 rounded-md border border-rule bg-card p-4 text-sm">
        <label className="flex items-start gap-3">
          <input type="checkbox" name="enabled" defaultChecked={loaderData.enabled} className="mt-1" />
          <span>
            <span className="font-medium">Send me the daily digest and reminders</span>
            <span className="block text-ink-soft">Site managers get the overdue checks and those due this week, each morning in the site's time. Metrologists and trainees get reminders before training records and weight certificates expire.</span>
          </span>
        </label>
        <div><Button type="submit">Save</Button></div>
      </Form>
    </>
  );
}
