import { parseWithZod } from "@conform-to/zod/v4";
import { data, Link, redirect } from "react-router";
import { formWeights, planDefaults } from "~/components/plans/plan-defaults";
import { PlanForm } from "~/components/plans/plan-form";
import { PlanFormSchema } from "~/components/plans/plan-form-schema";
import { Caution, PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireViewer } from "~/lib/guards.server";
import { forbiddenPage } from "~/lib/http.server";
import { can } from "~/lib/permissions";
import { localDate } from "~/lib/schedule";
import { instrumentRow, measuredMinimumWeight, plansOfInstrument, savePlan, siteWeights } from "~/queries/plans.server";
import { CHECK_TYPES } from "../../db/schema/enums";
import type { Route } from "./+types/plans-new";

export const meta = () => [{ title: "New check plan · Tareline" }];

async function context(request: Request, id: string | undefined) {
  const viewer = await requireViewer(request);
  const { visible, row } = await instrumentRow(db(), viewer, Number(id));
  if (!can(viewer, "manage_instruments", visible.siteId)) throw forbiddenPage("Only a metrologist or an administrator sets check plans.");
  return { viewer, visible, row, today: localDate(new Date(), visible.siteTimeZone) };
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const { visible, row, today } = await context(request, params.id);
  const [plans, weights, measured] = await Promise.all([plansOfInstrument(db(), row.id), siteWeights(db(), row.siteId), measuredMinimumWeight(db(), row.id)]);
  const taken = plans.map((p) => p.checkType);
  const type = CHECK_TYPES.find((t) => t === new URL(request.url).searchParams.get("type")) ?? CHECK_TYPES.find((t) => !taken.includes(t)) ?? "sensitivity";
  return { instrument: visible, row, taken, defaults: planDefaults(row, null, [], type), weights: formWeights(weights, today), measured };
}

export async function action({ request, params }: Route.ActionArgs) {
  const { viewer, row, today } = await context(request, params.id);
  const submission = parseWithZod(await request.formData(), { schema: PlanFormSchema });
  if (submission.status !== "success") return data(submission.reply(), { status: 400 });
  const saved = await savePlan(db(), viewer, { instrument: row, planId: null, form: submission.value, today });
  if (!saved.ok) return data(submission.reply({ fieldErrors: saved.fieldErrors }), { status: 400 });
  return redirect(`/plans/${saved.planId}?saved=1`);
}

export default function NewPlan({ loaderData, actionData }: Route.ComponentProps) {
  const { instrument, row, taken, defaults, weights, measured } = loaderData;
  return (
    <>
      <PageHeader title={`New check plan · ${instrument.assetTag}`} subtitle="Assess the risk first: the suggestion is shown beside the interval, and nothing changes until you save." />
      <p className="mb-4 text-sm"><Link to={`/instruments/${instrument.id}/plans`} className="text-accent underline">Plans of {instrument.assetTag}</Link></p>
      <PlanForm lastResult={actionData} defaultValue={defaults} fixedType={null} takenTypes={taken} instrument={row} measuredMinimumWeightG={measured} weights={weights} submitLabel="Create plan" />
      <div className="mt-6 max-w-4xl">
        <Caution>A check plan supports, and does not replace, calibration by an accredited provider, your site's quality system and the maker's instructions.</Caution>
      </div>
    </>
  );
}
