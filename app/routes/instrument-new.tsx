import { redirect } from "react-router";
import { InstrumentForm } from "~/components/instruments/instrument-form";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { duplicateTagFailure, parseInstrumentSubmission } from "~/lib/instrument-action.server";
import { createInstrument, listSitesAndRooms } from "~/queries/instruments.server";
import type { Route } from "./+types/instrument-new";

export const meta = () => [{ title: "Register an instrument · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "manage_instruments");
  return listSitesAndRooms(db(), viewer);
}

export async function action({ request }: Route.ActionArgs) {
  const viewer = await requireCapability(request, "manage_instruments");
  const parsed = await parseInstrumentSubmission(request, viewer);
  if (parsed.failure) return parsed.failure;
  try {
    const row = await createInstrument(db(), viewer, parsed.values);
    return redirect(`/instruments/${row.id}`);
  } catch (error) {
    return duplicateTagFailure(parsed.submission, error);
  }
}

export default function NewInstrument({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <>
      <PageHeader title="Register an instrument" subtitle="Enter the values from the instrument's data plate and its calibration certificate." />
      <InstrumentForm lastResult={actionData} sites={loaderData.sites} rooms={loaderData.rooms} submitLabel="Register instrument" defaultValue={{ smallestNetWeightUnit: "g", riskLevel: "medium" }} />
    </>
  );
}
