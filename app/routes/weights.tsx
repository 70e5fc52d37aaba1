import { Link } from "react-router";
import { ButtonLink } from "~/components/ui/button";
import { PageHeader } from "~/components/ui/page-header";
import { db } from "~/lib/db.server";
import { requireCapability } from "~/lib/guards.server";
import { can } from "~/lib/permissions";
import { daysBetween, localDate } from "~/lib/schedule";
import { formatMass, naturalUnit } from "~/lib/units";
import { listWeights } from "~/queries/weights.server";
import type { Route } from "./+types/weights";

export const meta = () => [{ title: "Test weights · Tareline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireCapability(request, "view");
  const site = Number(new URL(request.url).searchParams.get("site")) || undefined;
  const now = new Date();
  const rows = await listWeights(db(), viewer, site);
  return {
    weights: rows.map((r) => {
      const left = daysBetween(localDate(now, r.timeZone), r.weight.dueOn);
      return { ...r.weight, siteCode: r.siteCode, plans: r.plans, daysLeft: left };
    }),
    canManage: can(viewer, "manage_instruments"),
  };
}

function CertificateState({ daysLeft }: { daysLeft: number }) {
  if (daysLeft < 0) return <span className="inline-flex items-center gap-1.5 font-medium text-out"><svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true"><path d="M2.5 2.5l7 7M9.5 2.5l-7 7" className="stroke-out" strokeWidth="2" /></svg>Expired {-daysLeft} d ago</span>;
  if (daysLeft <= 30) return <span className="inline-flex items-center gap-1.5 text-guard"><svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true"><path d="M6 1.5 11 10.5H1Z" className="fill-none stroke-guard" strokeWidth="1.5" /></svg>Due in {daysLeft} d</span>;
  return <span className="text-ink-soft">Current</span>;
}

export default function Weights({ loaderData }: Route.ComponentProps) {
  const { weights, canManage } = loaderData;
  return (
    <>
      <PageHeader title="Test weights" subtitle="Every weight with its certificate. A weight past its due date cannot be chosen for a check." action={canManage ? <ButtonLink to="/weights/new">Register a weight</ButtonLink> : null} />
      {weights.length === 0 ? <p className="rounded-md border border-dashed border-rule bg-card p-8 text-center text-ink-soft">No test weights registered yet.</p> : (
        <table className="w-full rounded-md border border-rule bg-card text-sm">
          <thead className="border-b border-rule text-ink-soft">
            <tr>
              {["Identifier", "Site", "Nominal", "Class", "Conventional mass", "U (k = 2)", "Certificate", "Due", "Plans"].map((h) => <th key={h} scope="col" className={`px-3 py-2 font-medium ${h === "Plans" ? "text-right" : "text-left"}`}>{h}</th>)}
            </tr>
          </thead>
          <tbody>
            {weights.map((w) => (
              <tr key={w.id} className="border-b border-rule/60 last:border-0">
                <td className="px-3 py-2"><Link to={`/weights/${w.id}`} className="text-accent-deep underline">{w.identifier}</Link>{w.setLabel ? <span className="ml-1 text-ink-faint">({w.setLabel})</span> : null}</td>
                <td className="px-3 py-2">{w.siteCode}</td>
                <td className="num px-3 py-2">{formatMass(w.nominalG, naturalUnit(w.nominalG))}</td>
                <td className="px-3 py-2">{w.weightClass}</td>
                <td className="num px-3 py-2">{w.conventionalMassG} g</td>
                <td className="num px-3 py-2">{formatMass(w.expandedUncertaintyG, "mg")}</td>
                <td className="px-3 py-2">{w.certificateNumber}{w.certificateFile ? " · file" : ""}</td>
                <td className="num px-3 py-2">{w.dueOn} <CertificateState daysLeft={w.daysLeft} /></td>
                <td className="num px-3 py-2 text-right">{w.plans}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </>
  );
}
