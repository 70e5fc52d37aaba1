import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import { PageHeader } from "~/components/ui/page-header";
import { env } from "~/lib/env.server";
import { requireViewer } from "~/lib/guards.server";
import { notFoundPage } from "~/lib/http.server";
import type { Route } from "./+types/outbox";

export const meta = () => [{ title: "Outbox · Tareline" }];

function header(raw: string, name: string): string {
  const match = new RegExp(`^${name}:\\s*(.*(?:\\r?\\n[ \\t].*)*)`, "im").exec(raw);
  return match ? match[1].replace(/\r?\n[ \t]+/g, " ").trim() : "";
}

function body(raw: string): string {
  const split = raw.search(/\r?\n\r?\n/);
  const text = split === -1 ? "" : raw.slice(split).trim();
  return text.replace(/=\r?\n/g, "").replace(/=([0-9A-F]{2})/g, (_, hex: string) => String.fromCharCode(parseInt(hex, 16)));
}

// Development only: the mail the SMTP fake received, newest first.
export async function loader({ request }: Route.LoaderArgs) {
  await requireViewer(request);
  const dir = env().OUTBOX_DIR;
  if (!dir) throw notFoundPage("There is no development outbox in this installation.");
  const files = (await readdir(dir).catch(() => [] as string[])).filter((f) => f.endsWith(".eml")).sort().reverse().slice(0, 100);
  const messages = await Promise.all(
    files.map(async (file) => {
      const raw = await readFile(path.join(dir, file), "utf8");
      return { file, to: header(raw, "To"), subject: header(raw, "Subject"), date: header(raw, "Date"), body: body(raw) };
    }),
  );
  return { messages };
}

export default function Outbox({ loaderData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Outbox (development)" subtitle="Messages the local mail fake received. In production mail goes to your SMTP relay." />
      {loaderData.messages.length === 0 ? <p className="text-ink-soft">No messages yet. An out-of-tolerance check sends one to the site's metrologists.</p> : null}
      <ul className="grid max-w-4xl gap-3">
        {loaderData.messages.map((m) => (
          <li key={m.file} className="rounded-md border border-rule bg-card p-4">
            <p className="font-semibold">{m.subject}</p>
            <p className="text-sm text-ink-soft">To {m.to} · {m.date}</p>
            <pre className="mt-2 whitespace-pre-wrap font-sans text-sm">{m.body}</pre>
          </li>
        ))}
      </ul>
    </>
  );
}
