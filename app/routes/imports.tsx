import { Link } from "react-router";
import { ImportStatusLabel } from "~/components/imports/status-label";
import { UploadPanel } from "~/components/imports/upload-panel";
import { Caution, PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { listImports } from "~/queries/imports-status.server";
import { MAX_UPLOAD_BYTES } from "~/queries/imports-upload.server";
import type { Route } from "./+types/imports";

export const meta = () => [{ title: "Imports · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "import_csv");
  return { imports: await listImports(db(), viewer), maxBytes: MAX_UPLOAD_BYTES };
}

const when = (iso: string) => new Date(iso).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" }) + " UTC";

export default function Imports({ loaderData }: Route.ComponentProps) {
  const { imports, maxBytes } = loaderData;
  return (
    <>
      <PageHeader title="Imports" subtitle="Bring check history from a spreadsheet or another system. Every row is checked before anything is written." />
      <div className="grid gap-6">
        <UploadPanel maxBytes={maxBytes} />
        <Caution>Imported checks are judged by the same rules as checks recorded here. An imported result is a record for your quality system to review; it does not replace the instrument's calibration.</Caution>
        <section aria-labelledby="past-imports">
          <h2 id="past-imports" className="mb-2 text-lg font-semibold">Your imports</h2>
          {imports.length === 0 ? (
            <p className="rounded-md border border-dashed border-rule bg-card p-6 text-ink-soft">No imports yet. Upload a CSV file above; the README describes Tareline's own column format.</p>
          ) : (
            <div className="overflow-x-auto rounded-md border border-rule bg-card">
              <table className="w-full text-sm">
                <thead className="border-b border-rule bg-paper-deep/50 text-ink-soft">
                  <tr>
                    <th scope="col" className="px-3 py-2 text-left font-medium">File</th>
                    <th scope="col" className="px-3 py-2 text-left font-medium">Uploaded</th>
                    <th scope="col" className="px-3 py-2 text-left font-medium">Status</th>
                    <th scope="col" className="px-3 py-2 text-right font-medium">Rows</th>
                    <th scope="col" className="px-3 py-2 text-right font-medium">Imported</th>
                    <th scope="col" className="px-3 py-2 text-right font-medium">Rejected</th>
                    <th scope="col" className="px-3 py-2 text-right font-medium">Duplicates</th>
                  </tr>
                </thead>
                <tbody>
                  {imports.map((i) => (
                    <tr key={i.id} className="border-b border-rule/60 last:border-0 hover:bg-paper">
                      <td className="px-3 py-2 font-medium"><Link to={`/imports/${i.id}`} className="text-accent-deep hover:underline">{i.filename}</Link></td>
                      <td className="px-3 py-2">{when(i.createdAt)}</td>
                      <td className="px-3 py-2"><ImportStatusLabel status={i.status} /></td>
                      <td className="num px-3 py-2 text-right">{i.counts.total}</td>
                      <td className="num px-3 py-2 text-right">{i.counts.imported}</td>
                      <td className="num px-3 py-2 text-right">{i.counts.rejected}</td>
                      <td className="num px-3 py-2 text-right">{i.counts.duplicates}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </section>
      </div>
    </>
  );
}
