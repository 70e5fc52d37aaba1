import { Form } from "react-router";
import { Button } from "~/components/ui/button";
import { useImportQuery } from "~/hooks/use-import-query";
import type { ImportStatusResponse } from "~/routes/api/imports-status";
import { ProgressBar } from "./progress-bar";
import { ImportStatusLabel } from "./status-label";

const n = (value: number) => value.toLocaleString("en-GB");
const validRows = (count: number) => (count === 1 ? "1 valid row" : `${n(count)} valid rows`);
const megabytes = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;

function Result({ status }: { status: ImportStatusResponse }) {
  const { counts, outcome } = status;
  if (status.status === "failed") return <p role="alert" className="text-out">{status.error ?? "The import stopped; nothing was written."}</p>;
  if (status.status === "rejected") {
    return (
      <div role="alert" className="grid gap-3">
        <p>Nothing was imported: {n(counts.rejected)} of {n(counts.total)} rows were rejected. Download the report, correct those lines and upload the file again{status.canImportValidRows ? ", or import only the valid rows" : ""}.</p>
        {status.canImportValidRows ? (
          <Form method="post">
            <Button type="submit" name="intent" value="import-valid-rows" variant="secondary">Import the {validRows(counts.valid - counts.duplicates)} and keep the report</Button>
          </Form>
        ) : null}
      </div>
    );
  }
  if (status.status !== "done" || !outcome) return null;
  return (
    <div className="grid gap-3" role="status">
      <p>{n(outcome.imported)} check{outcome.imported === 1 ? "" : "s"} imported{counts.duplicates ? `; ${n(counts.duplicates)} already recorded, so not added again` : ""}{counts.rejected ? `; ${n(counts.rejected)} rejected` : ""}.</p>
      {outcome.outOfService.map((s) => (
        <p key={`${s.assetTag}-${s.checkType}`} className="rounded-md border border-out bg-card p-3 text-out">
          {s.assetTag} was taken out of service: its newest {s.checkType} check ({s.performedAt.slice(0, 16).replace("T", " ")} UTC) is an imported out-of-tolerance result. An impact review is open; assess the weighings since the last passing check under your site's quality system.
        </p>
      ))}
      {outcome.historicFailures > 0 ? (
        <p className="text-ink-soft">{n(outcome.historicFailures)} imported out-of-tolerance result{outcome.historicFailures === 1 ? " is" : "s are"} older than the newest check of {outcome.historicFailures === 1 ? "its" : "their"} series: recorded as history, without changing any instrument's status.</p>
      ) : null}
    </div>
  );
}

/** Progress while the job runs (polled), then the result; the loader's copy paints first. */
export function ImportStatusPanel({ initial }: { initial: ImportStatusResponse }) {
  const { data: status, error } = useImportQuery(initial.id, initial);
  const { counts } = status;
  return (
    <section aria-labelledby="import-status" className="grid max-w-3xl gap-4 rounded-md border border-rule bg-card p-5">
      <h2 id="import-status" className="text-lg font-semibold"><ImportStatusLabel status={status.status} /></h2>
      {status.status === "validating" ? (
        <ProgressBar label="File read and checked" value={status.bytesRead} max={status.bytesTotal} detail={`${megabytes(status.bytesRead)} of ${megabytes(status.bytesTotal ?? 0)} read · ${n(counts.total)} rows · ${n(counts.rejected)} rejected so far`} />
      ) : null}
      {status.status === "importing" ? <ProgressBar label="Writing checks" value={0} max={null} detail={`${n(counts.valid)} rows passed; finding duplicates and writing them in one transaction`} /> : null}
      {error ? <p role="alert" className="text-sm text-out">{error.message} The page keeps trying.</p> : null}
      <Result status={status} />
      <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-1 text-sm">
        <dt className="text-ink-soft">Rows read</dt><dd className="num">{n(counts.total)}</dd>
        <dt className="text-ink-soft">Passed every check</dt><dd className="num">{n(counts.valid)}</dd>
        <dt className="text-ink-soft">Rejected</dt><dd className="num">{n(counts.rejected)}</dd>
        <dt className="text-ink-soft">Already recorded</dt><dd className="num">{n(counts.duplicates)}</dd>
      </dl>
      {status.reportUrl && !status.running ? <p><a href={status.reportUrl} download className="text-accent underline">Download the report of rejected and duplicate rows (CSV)</a></p> : null}
    </section>
  );
}
