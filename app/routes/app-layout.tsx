import { Form, NavLink, Outlet } from "react-router";
import { requireViewer } from "~/lib/guards.server";
import { can, isAdmin, primaryRole, ROLE_LABELS } from "~/lib/permissions";
import { db } from "~/lib/db.server";
import { env } from "~/lib/env.server";
import { listSitesAndRooms } from "~/queries/instruments.server";
import type { Route } from "./+types/app-layout";

export async function loader({ request }: Route.LoaderArgs) {
  const viewer = await requireViewer(request);
  const { sites } = await listSitesAndRooms(db(), viewer);
  const role = primaryRole(viewer);
  return {
    viewer: { name: viewer.name, email: viewer.email, role: role ? ROLE_LABELS[role] : "No role" },
    sites: sites.map((s) => ({ id: s.id, code: s.code, name: s.name })),
    site: Number(new URL(request.url).searchParams.get("site")) || null,
    nav: {
      fleet: can(viewer, "export_csv") || can(viewer, "view_audit"),
      due: can(viewer, "record_check"),
      schedule: !can(viewer, "record_check"),
      audit: can(viewer, "view_audit"),
      exports: can(viewer, "export_csv"),
      imports: can(viewer, "import_csv"),
      admin: isAdmin(viewer),
      outbox: Boolean(env().OUTBOX_DIR),
    },
  };
}

const linkClass = ({ isActive }: { isActive: boolean }) =>
  `block rounded-md px-3 py-2 text-sm ${isActive ? "bg-accent-wash font-semibold text-accent-deep" : "text-ink-soft hover:bg-paper-deep hover:text-ink"}`;

export default function AppLayout({ loaderData }: Route.ComponentProps) {
  const { viewer, sites, site, nav } = loaderData;
  return (
    <div className="flex min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-card focus:p-2">
        Skip to content
      </a>
      <nav aria-label="Main" className="flex w-60 shrink-0 flex-col gap-6 border-r border-rule bg-paper-deep/60 px-4 py-5">
        <div>
          <p className="text-lg font-semibold tracking-tight text-accent-deep">Tareline</p>
          <Form method="get" action="/instruments" className="mt-3">
            <label htmlFor="site-switcher" className="text-xs font-medium uppercase tracking-wide text-ink-faint">
              Site
            </label>
            <div className="mt-1 flex gap-1">
              <select id="site-switcher" name="site" defaultValue={site ?? ""} className="w-full rounded-md border border-rule bg-card px-2 py-1.5 text-sm">
                <option value="">All my sites</option>
                {sites.map((s) => (
                  <option key={s.id} value={s.id}>
                    {s.code} · {s.name}
                  </option>
                ))}
              </select>
              <button type="submit" className="rounded-md border border-rule bg-card px-2 text-sm" aria-label="Show this site">
                Go
              </button>
            </div>
          </Form>
        </div>
        <ul className="flex flex-col gap-0.5">
          {nav.fleet ? <li><NavLink to="/fleet" className={linkClass}>Fleet</NavLink></li> : null}
          <li><NavLink to="/instruments" className={linkClass}>Instruments</NavLink></li>
          {nav.due ? <li><NavLink to="/checks-due" className={linkClass}>Checks due</NavLink></li> : null}
          {nav.schedule ? <li><NavLink to="/schedule" className={linkClass}>Schedule</NavLink></li> : null}
          <li><NavLink to="/weights" className={linkClass}>Test weights</NavLink></li>
          <li><NavLink to="/training" className={linkClass}>Training</NavLink></li>
          {nav.imports ? <li><NavLink to="/imports" className={linkClass}>Imports</NavLink></li> : null}
          {nav.exports ? <li><NavLink to="/export" className={linkClass}>Exports</NavLink></li> : null}
          {nav.audit ? <li><NavLink to="/audit" className={linkClass}>Audit trail</NavLink></li> : null}
          {nav.admin ? <li><NavLink to="/admin" className={linkClass}>Admin</NavLink></li> : null}
          {nav.outbox ? <li><NavLink to="/outbox" className={linkClass}>Outbox (development)</NavLink></li> : null}
        </ul>
        <div className="mt-auto border-t border-rule pt-4 text-sm">
          <p className="font-medium">{viewer.name}</p>
          <p className="text-ink-faint">{viewer.role}</p>
          <NavLink to="/schedule/email" className="text-accent underline">E-mail digests</NavLink>
          <Form method="post" action="/logout" className="mt-2">
            <button type="submit" className="text-accent underline">Sign out</button>
          </Form>
        </div>
      </nav>
      <main id="main" className="min-w-0 flex-1 px-8 py-6">
        <Outlet />
      </main>
    </div>
  );
}
