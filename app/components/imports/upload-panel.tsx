import { useRef, useState, type FormEvent } from "react";
import { useNavigate } from "react-router";
import { Button } from "~/components/ui/button";
import { ProgressBar } from "./progress-bar";

type UploadState = { phase: "idle" } | { phase: "uploading"; sent: number; total: number } | { phase: "failed"; message: string };

const megabytes = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;

/** Sends the file as the request body, so the server can stream it to disk, with the upload's own progress. */
export function UploadPanel({ maxBytes }: { maxBytes: number }) {
  const input = useRef<HTMLInputElement>(null);
  const [state, setState] = useState<UploadState>({ phase: "idle" });
  const navigate = useNavigate();

  const upload = (event: FormEvent) => {
    event.preventDefault();
    const file = input.current?.files?.[0];
    if (!file) return setState({ phase: "failed", message: "Choose a CSV file first." });
    if (file.size > maxBytes) return setState({ phase: "failed", message: `The file is ${megabytes(file.size)}; files up to ${megabytes(maxBytes)} are imported. Split it into parts.` });
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `/api/v1/imports?filename=${encodeURIComponent(file.name)}`);
    xhr.setRequestHeader("Content-Type", "text/csv");
    xhr.upload.onprogress = (e) => setState({ phase: "uploading", sent: e.loaded, total: e.lengthComputable ? e.total : file.size });
    xhr.onerror = () => setState({ phase: "failed", message: "The upload was interrupted. Check the connection and try again." });
    xhr.onload = () => {
      let body: { id?: number; detail?: string } = {};
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        // not JSON: the status line says enough
      }
      if (xhr.status === 201 && body.id) navigate(`/imports/${body.id}`);
      else setState({ phase: "failed", message: body.detail ?? `The server refused the file (${xhr.status}).` });
    };
    setState({ phase: "uploading", sent: 0, total: file.size });
    xhr.send(file);
  };

  return (
    <form onSubmit={upload} className="grid max-w-2xl gap-4 rounded-md border border-rule bg-card p-5" aria-label="Upload a CSV file">
      <label className="grid gap-1 text-sm">
        <span className="font-medium">CSV file of check history</span>
        <input ref={input} type="file" name="file" accept=".csv,.txt,text/csv,text/plain" className="text-sm" />
        <span className="text-xs text-ink-faint">Comma-, semicolon- or tab-separated; UTF-8, UTF-16 or Latin-1; up to {megabytes(maxBytes)}. The first line names the columns.</span>
      </label>
      {state.phase === "uploading" ? <ProgressBar label="Uploading" value={state.sent} max={state.total} detail={`${megabytes(state.sent)} of ${megabytes(state.total)}`} /> : null}
      {state.phase === "failed" ? <p role="alert" className="text-sm text-out">{state.message}</p> : null}
      <noscript><p className="text-sm text-out">Uploading needs JavaScript, so the file can be streamed with a progress bar.</p></noscript>
      <div>
        <Button type="submit" disabled={state.phase === "uploading"}>Upload and preview</Button>
      </div>
    </form>
  );
}
