// The JavaScript each page ships, read from a build's React Router manifest (the same list the server puts in the
// page's modulepreload links), so a chunk shared by several pages is never counted by its file name.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";

interface ManifestEntry {
  module: string;
  imports?: string[];
}
interface RouteEntry extends ManifestEntry {
  id: string;
  parentId?: string;
}
interface Manifest {
  entry: ManifestEntry;
  routes: Record<string, RouteEntry>;
}

/** client/assets/manifest-<hash>.js is `window.__reactRouterManifest={…};`. */
function readManifest(clientDir: string): Manifest {
  const file = readdirSync(path.join(clientDir, "assets")).find((f) => /^manifest-[\w-]+\.js$/.test(f));
  if (!file) throw new Error(`No React Router manifest in ${clientDir}/assets`);
  const text = readFileSync(path.join(clientDir, "assets", file), "utf8");
  return JSON.parse(text.slice(text.indexOf("=") + 1).replace(/;\s*$/, ""));
}

const filesOf = (entry: ManifestEntry) => [entry.module, ...(entry.imports ?? [])];

/** A route's own files and those of its layouts up to the root, as the browser loads them for that page. */
function routeChain(manifest: Manifest, id: string): string[] {
  const files: string[] = [];
  let route: RouteEntry | undefined = manifest.routes[id];
  while (route) {
    files.push(...filesOf(route));
    route = route.parentId ? manifest.routes[route.parentId] : undefined;
  }
  return files;
}

export interface PageWeight {
  routeId: string;
  ownBytes: number;
  ownFiles: number;
}

/**
 * Gzip sizes per page. "Shell" is what every signed-in page loads (client entry, root, app layout); a page's own
 * share is everything else it loads, including chunks it shares with some other pages.
 */
export function pageWeights(buildDir: string, routeIds: string[], layoutId = "routes/app-layout") {
  const clientDir = path.join(buildDir, "client");
  const manifest = readManifest(clientDir);
  const sizes = new Map<string, number>();
  const gz = (files: Iterable<string>) => {
    let total = 0;
    for (const file of files) {
      if (!sizes.has(file)) sizes.set(file, gzipSync(readFileSync(path.join(clientDir, file))).length);
      total += sizes.get(file)!;
    }
    return total;
  };
  const shell = new Set([...filesOf(manifest.entry), ...routeChain(manifest, layoutId)]);
  const pages: PageWeight[] = routeIds.map((routeId) => {
    if (!manifest.routes[routeId]) throw new Error(`Route ${routeId} is not in the build's manifest`);
    const own = new Set(routeChain(manifest, routeId).filter((f) => !shell.has(f)));
    return { routeId, ownBytes: gz(own), ownFiles: own.size };
  });
  return { shellBytes: gz(shell), shellFiles: shell.size, pages };
}
