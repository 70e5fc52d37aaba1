// POST /api/v1/imports: the file itself as the request body (any CSV, streamed to disk, never whole in memory),
// its name in ?filename=. Answers 201 with the new import, waiting for its column mapping. GET lists your imports.
import { Readable } from "node:stream";
import type { ReadableStream as NodeReadableStream } from "node:stream/web";
import { db } from "~/lib/db.server";
import { requireApiViewer } from "~/lib/guards.server";
import { forbidden, problem } from "~/lib/http.server";
import { can } from "~/lib/permissions";
import { findImport, importStatusView, listImports } from "~/queries/imports-status.server";
import { MAX_UPLOAD_BYTES, receiveUpload, UploadRefused } from "~/queries/imports-upload.server";
import type { Route } from "./+types/imports";

export async function action({ request }: Route.ActionArgs) {
  const viewer = await requireApiViewer(request);
  if (request.method !== "POST") return problem(405, "Method not allowed", "POST the CSV file as the request body.");
  if (!can(viewer, "import_csv")) return forbidden("Your role does not import checks.");
  const declared = Number(request.headers.get("Content-Length") ?? 0);
  if (declared > MAX_UPLOAD_BYTES) return problem(413, "File too large", `Files up to ${MAX_UPLOAD_BYTES / 1024 / 1024} MB are imported; split a larger one.`);
  if (!request.body) return problem(400, "No file", "Send the CSV file as the request body.");
  const filename = new URL(request.url).searchParams.get("filename") ?? "upload.csv";
  try {
    const id = await receiveUpload(db(), viewer, { filename, body: Readable.fromWeb(request.body as NodeReadableStream<Uint8Array>) });
    const row = await findImport(db(), viewer, id);
    return Response.json(row ? await importStatusView(row) : { id }, { status: 201, headers: { Location: `/api/v1/imports/${id}` } });
  } catch (error) {
    if (error instanceof UploadRefused) return problem(error.status, "File not accepted", error.message);
    throw error;
  }
}

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireApiViewer(request);
  if (!can(viewer, "import_csv")) return forbidden("Your role does not import checks.");
  return Response.json({ imports: await listImports(db(), viewer) });
}
