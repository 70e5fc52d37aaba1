import { parseWithZod } from "@conform-to/zod/v4";
import { data, redirect } from "react-router";
import { WeightForm } from "~/components/weights/weight-form";
import { WeightFormSchema } from "~/components/weights/weight-form-schema";
import { Caution, PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { forbiddenPage } from "~/lib/http.server";
import { can } from "~/lib/permissions";
import { certificateFrom, readUploadForm } from "~/lib/storage-upload.server";
import { listSitesAndRooms } from "~/queries/instruments.server";
import { DuplicateWeightError, saveWeight } from "~/queries/weights.server";
import type { Route } from "./+types/weights-new";

export const meta = () => [{ title: "Register a test weight · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "manage_instruments");
  const { sites } = await listSitesAndRooms(db(), viewer);
  return { sites: sites.filter((s) => can(viewer, "manage_instruments", s.id)).map((s) => ({ id: s.id, code: s.code, name: s.name })) };
}

export async function action({ request }: Route.ActionArgs) {
  const viewer = await requireCapability(request, "manage_instruments");
  const form = await readUploadForm(request);
  const submission = parseWithZod(form, { schema: WeightFormSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), certificateError: null }, { status: 400 });
  if (!can(viewer, "manage_instruments", submission.value.siteId)) throw forbiddenPage();
  const certificate = await certificateFrom(form);
  if (certificate.problem) return data({ result: submission.reply(), certificateError: certificate.problem }, { status: 400 });
  try {
    const row = await saveWeight(db(), viewer, { id: null, form: submission.value, certificate: certificate.upload });
    return redirect(`/weights/${row.id}?saved=1`);
  } catch (error) {
    if (error instanceof DuplicateWeightError) return data({ result: submission.reply({ fieldErrors: { identifier: [error.message] } }), certificateError: null }, { status: 400 });
    throw error;
  }
}

export default function NewWeight({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Register a test weight" subtitle="Type the values exactly as the calibration certificate states them." />
      <WeightForm lastResult={actionData?.result} certificateError={actionData?.certificateError} sites={loaderData.sites} defaultValue={{ unit: "g" }} submitLabel="Register weight" />
      <div className="mt-6 max-w-3xl"><Caution>Weights over 20 kg need lifting aids and two people; follow your site's manual-handling rules.</Caution></div>
    </>
  );
}
