import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { notFoundPage } from "~/lib/http.server";
import { certificateStorage } from "~/lib/storage.server";
import { getWeight } from "~/queries/weights.server";
import type { Route } from "./+types/weights-certificate";

// The certificate file, for anyone who may see the weight; served with its checked type, never sniffed by the browser.
export async function loader({ request, params }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  const { weight } = await getWeight(db(), viewer, Number(params.id));
  const bytes = weight.certificateFile ? await certificateStorage().get(weight.certificateFile) : null;
  if (!bytes || !weight.certificateMediaType) throw notFoundPage("No certificate file is stored for this weight.");
  const name = (weight.certificateFileName ?? `${weight.identifier}-certificate`).replace(/[^\w.-]+/g, "_");
  return new Response(new Blob([new Uint8Array(bytes)]), {
    headers: { "Content-Type": weight.certificateMediaType, "Content-Disposition": `inline; filename="${name}"`, "X-Content-Type-Options": "nosniff", "Cache-Control": "private, no-store" },
  });
}
