import { redirect } from "react-router";
import { InstrumentForm } from "~/components/instruments/instrument-form";
import { Button } from "~/components/ui/button";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { forbiddenPage } from "~/lib/http.server";
import { requireViewer } from "~/lib/guards.server";
import { duplicateTagFailure, parseInstrumentSubmission } from "~/lib/instrument-action.server";
import { can, type Viewer } from "~/lib/permissions";
import { fromGrams } from "~/lib/units";
import { getInstrumentPage, listSitesAndRooms, retireInstrument, updateInstrument } from "~/queries/instruments.server";
import type { Route } from "./+types/instrument-edit";

export const meta = () => [{ title: "Edit instrument · Tareline" }];

async function requireEditable(request: Request, id: number): Promise<{ viewer: Viewer; instrument: Awaited<ReturnType<typeof getInstrumentPage>> }> {
  const viewer = await requireViewer(request);
  const instrument = await getInstrumentPage(db(), viewer, id);
  if (!can(viewer, "manage_instruments", instrument.siteId)) throw forbiddenPage();
  return { viewer, instrument };
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const { viewer, instrument } = await requireEditable(request, Number(params.id));
  return { instrument, ...(await listSitesAndRooms(db(), viewer)) };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { viewer, instrument } = await requireEditable(request, Number(params.id));
  if (new URL(request.url).searchParams.get("intent") === "retire") {
    const form = await request.formData();
    const reason = String(form.get("reason") ?? "").trim();
    if (!reason) return Response.json({ retireError: "Give the reason for retiring the instrument." }, { status: 400 });
    await retireInstrument(db(), viewer, instrument.id, reason);
    return redirect(`/instruments/${instrument.id}`);
  }
  const parsed = await parseInstrumentSubmission(request, viewer);
  if (parsed.failure) return parsed.failure;
  try {
    await updateInstrument(db(), viewer, instrument.id, parsed.values);
    return redirect(`/instruments/${instrument.id}`);
  } catch (error) {
    return duplicateTagFailure(parsed.submission, error);
  }
}

export default function EditInstrument({ loaderData, actionData }: Route.ComponentProps) {
  const { instrument, sites, rooms } = loaderData;
  const unit = instrument.displayUnit;
  const smallestUnit = "g";
  const lastResult = actionData && "status" in actionData ? actionData : undefined;
  const retireError = actionData && "retireError" in actionData ? String(actionData.retireError) : null;
  return (
    <>
      <PageHeader title={`Edit ${instrument.assetTag}`} subtitle="Every change is kept in the audit trail with its before and after values." />
      <InstrumentForm
        lastResult={lastResult}
        sites={sites}
        rooms={rooms}
        submitLabel="Save changes"
        defaultValue={{
          assetTag: instrument.assetTag,
          siteId: String(instrument.siteId),
          roomId: instrument.roomId ? String(instrument.roomId) : undefined,
          kind: instrument.kind,
          description: instrument.description,
          serialNumber: instrument.serialNumber,
          unit,
          capacity: fromGrams(instrument.capacityG, unit),
          readability: fromGrams(instrument.readabilityG, unit),
          verificationInterval: fromGrams(instrument.verificationIntervalG, unit),
          accuracyClass: instrument.accuracyClass ?? "none",
          smallestNetWeight: instrument.smallestNetWeightG ? fromGrams(instrument.smallestNetWeightG, smallestUnit) : undefined,
          smallestNetWeightUnit: smallestUnit,
          riskLevel: instrument.riskLevel,
        }}
      />
      {instrument.status !== "retired" ? (
        <form method="post" action={`?intent=retire`} className="mt-10 max-w-3xl rounded-md border border-rule p-4">
          <h2 className="font-semibold">Retire this instrument</h2>
          <p className="mt-1 text-sm text-ink-soft">Retired instruments keep their history and can no longer be checked. Nothing is deleted.</p>
          <label htmlFor="retire-reason" className="mt-3 block text-sm font-medium">Reason</label>
          <input id="retire-reason" name="reason" required className="mt-1 w-full rounded-md border border-rule bg-card px-3 py-2 text-sm" />
          {retireError ? <p role="alert" className="mt-1 text-sm text-out">{retireError}</p> : null}
          <Button variant="danger" type="submit" className="mt-3">Retire instrument</Button>
        </form>
      ) : null}
    </>
  );
}
