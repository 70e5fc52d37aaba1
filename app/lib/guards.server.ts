// Who is asking: the session cookie for pages, a bearer token or the cookie for the API.
import { redirect } from "react-router";
import { getViewer, userIdForToken } from "../queries/people.server";
import { db } from "./db.server";
import { can, type Capability, type Viewer } from "./permissions";
import { forbidden, forbiddenPage, unauthorized } from "./http.server";
import { getSession } from "./session.server";

export async function getOptionalViewer(request: Request): Promise<Viewer | null> {
  const session = await getSession(request);
  const userId = session.get("userId");
  return userId ? getViewer(db(), userId) : null;
}

export async function requireViewer(request: Request): Promise<Viewer> {
  const viewer = await getOptionalViewer(request);
  if (!viewer) {
    const url = new URL(request.url);
    throw redirect(`/login?redirectTo=${encodeURIComponent(url.pathname + url.search)}`);
  }
  return viewer;
}

/** UI guard: 403 page when the role lacks the capability (at the site, when one is named). */
export async function requireCapability(request: Request, capability: Capability, siteId?: number): Promise<Viewer> {
  const viewer = await requireViewer(request);
  if (!can(viewer, capability, siteId)) throw forbiddenPage();
  return viewer;
}

export async function requireApiViewer(request: Request): Promise<Viewer> {
  const header = request.headers.get("Authorization");
  if (header) {
    const match = /^Bearer\s+(\S+)$/i.exec(header);
    const userId = match ? await userIdForToken(db(), match[1]) : null;
    const viewer = userId ? await getViewer(db(), userId) : null;
    if (!viewer) throw unauthorized();
    return viewer;
  }
  const viewer = await getOptionalViewer(request);
  if (!viewer) throw unauthorized();
  return viewer;
}

export function assertCan(viewer: Viewer, capability: Capability, siteId?: number): void {
  if (!can(viewer, capability, siteId)) throw forbidden();
}
