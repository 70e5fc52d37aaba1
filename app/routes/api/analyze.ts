import { parseAnalyzeRequest } from "~/lib/analyze-request";
import { requireApiViewer } from "~/lib/guards.server";
import { problem } from "~/lib/http.server";
import { analyzeSeries } from "~/lib/stats/analyze";
import type { Route } from "./+types/analyze";

const MAX_BODY_BYTES = 5 * 1024 * 1024;

// The engine as a stateless service: the caller's own values in, limits, signals, trend and forecast out.
export async function action({ request }: Route.ActionArgs) {
  await requireApiViewer(request);
  if (request.method !== "POST") return problem(405, "Method not allowed", "Use POST with a JSON body.");
  const declared = Number(request.headers.get("Content-Length") ?? 0);
  if (declared > MAX_BODY_BYTES) return problem(413, "Body too large", "The body may be at most 5 MB.");
  const text = await request.text();
  if (Buffer.byteLength(text) > MAX_BODY_BYTES) return problem(413, "Body too large", "The body may be at most 5 MB.");
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    return problem(400, "Body is not JSON", "Send a JSON object with at least a \"values\" array.", [{ pointer: "", message: "Not valid JSON." }]);
  }
  const parsed = parseAnalyzeRequest(body);
  if (!parsed.ok) return problem(422, "Invalid analysis request", parsed.problems.map((p) => `${p.pointer || "/"}: ${p.message}`).join(" "), parsed.problems);
  return Response.json(analyzeSeries(parsed.value));
}

export function loader() {
  return problem(405, "Method not allowed", "POST a JSON body to /api/v1/analyze.");
}
