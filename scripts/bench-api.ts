// `npm run bench:api`: autocannon posts sensitivity checks to the production build for 30 s over 50 connections,
// each request with its own Idempotency-Key and a share of deliberate retries of earlier keys (same body).
// Prints req/s, p50/p99 latency, errors (must be 0) and the rows afterwards (one per distinct key, none twice).
// Usage: npm run bench:api -- [--port 3192] [--pg-port 54392] [--connections 50] [--duration 30] [--retry-share 0.1]
import { spawn, spawnSync } from "node:child_process";
import { randomUUID } from "node:crypto";
import { rm } from "node:fs/promises";
import path from "node:path";
import autocannon from "autocannon";
import { count, countDistinct, eq, inArray } from "drizzle-orm";
import { createDatabase } from "../app/lib/db.server";
import { createApiToken } from "../app/queries/people.server";
import { checks, users } from "../db/schema";
import { DEMO_PEOPLE } from "../db/seed/people";
import { seedDemo } from "../db/seed/seed";
import { appEnvironment } from "./lib/app-env";
import { ensureDatabase, runMigrations } from "./lib/database";
import { loadTargets, type GeneratorTarget } from "./lib/generate-check-csv";
import { removeCluster, startCluster } from "./lib/postgres";
import { startSmtpFake } from "./fakes/smtp";

const arg = (name: string, fallback: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const APP_PORT = arg("port", 3192);
const PG_PORT = arg("pg-port", 54392);
const CONNECTIONS = arg("connections", 50);
const DURATION = arg("duration", 30);
const RETRY_SHARE = arg("retry-share", 0.1);
const root = path.resolve(import.meta.dirname, "..");
const work = path.join(root, `.data/bench-api-${APP_PORT}`);
const buildDir = ".data/bench-build";
const TECHNICIANS = DEMO_PEOPLE.filter((p) => p.role === "technician" && p.training.includes("sensitivity"));

interface Poster {
  token: string;
  targets: GeneratorTarget[];
}

async function waitFor(url: string) {
  for (let i = 0; i < 240; i++) {
    if (await fetch(url).then((r) => r.ok, () => false)) return;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not come up`);
}

/** SIGTERM lets in-flight requests finish; the app's background queue keeps the process alive, so SIGKILL after 10 s. */
async function stopServer() {
  if (!server || server.exitCode !== null || server.signalCode !== null) return;
  const exited = new Promise((resolve) => server!.once("exit", resolve));
  server.kill("SIGTERM");
  const timer = setTimeout(() => server?.kill("SIGKILL"), 10_000);
  await exited;
  clearTimeout(timer);
}

await rm(work, { recursive: true, force: true });
process.env.PG_FSYNC = "off";
const cluster = startCluster({ dataDir: path.join(work, "postgres"), port: PG_PORT, database: "tareline_bench", log: () => {} });
let server: ReturnType<typeof spawn> | undefined;
let smtp: Awaited<ReturnType<typeof startSmtpFake>> | undefined;
try {
  await ensureDatabase(cluster.adminUrl, "tareline_bench");
  await runMigrations(cluster.url);
  const db = createDatabase(cluster.url, 4);
  await seedDemo(db);
  const targets = (await loadTargets(db)).filter((t) => t.type === "sensitivity");
  const posters: Poster[] = [];
  for (const person of TECHNICIANS) {
    const [user] = await db.select().from(users).where(eq(users.email, person.email));
    const { secret } = await db.transaction((tx) => createApiToken(tx, { userId: user.id, name: "bench:api", createdById: null }));
    posters.push({ token: secret, targets: targets.filter((t) => person.siteCodes.includes(t.assetTag.slice(0, 3))) });
  }

  console.log(`Building the production bundle into ${buildDir} …`);
  const build = spawnSync(process.execPath, [path.join(root, "node_modules/.bin/react-router"), "build"], { cwd: root, stdio: ["ignore", "ignore", "inherit"], env: { ...process.env, BUILD_DIR: buildDir } });
  if (build.status !== 0) throw new Error("react-router build failed");
  smtp = await startSmtpFake({ port: APP_PORT + 1000, outbox: path.join(work, "outbox") });
  const env = appEnvironment({ databaseUrl: cluster.url, appPort: APP_PORT, idpPort: APP_PORT + 2000, smtpPort: APP_PORT + 1000, secret: "bench-api-session-secret-0123456789", outbox: path.join(work, "outbox") });
  server = spawn(process.execPath, [path.join(root, "node_modules/.bin/react-router-serve"), path.join(root, buildDir, "server/index.js")], { cwd: root, env: { ...process.env, ...env, HOST: "127.0.0.1" }, stdio: ["ignore", "ignore", "inherit"] });
  await waitFor(`http://127.0.0.1:${APP_PORT}/healthz`);

  // Unique instants a second apart, all in the past: every fresh key is a distinct check.
  const base = Date.now() - 20 * 86_400_000;
  const sent: { key: string; token: string; body: string }[] = [];
  let fresh = 0;
  let retries = 0;
  const statuses = new Map<number, number>();
  const nextRequest = (request: autocannon.Request): autocannon.Request => {
    if (sent.length > 100 && Math.random() < RETRY_SHARE) {
      retries++;
      const earlier = sent[Math.floor(Math.random() * sent.length)];
      return { ...request, headers: { ...request.headers, authorization: `Bearer ${earlier.token}`, "idempotency-key": earlier.key }, body: earlier.body };
    }
    const poster = posters[fresh % posters.length];
    const target = poster.targets[Math.floor(fresh / posters.length) % poster.targets.length];
    const at = new Date(base + fresh * 1000).toISOString();
    fresh++;
    const body = JSON.stringify({ instrument: target.assetTag, type: "sensitivity", performedAt: at, unit: "g", weight: target.weight, readings: [target.loadG.toFixed(target.decimals)] });
    const key = randomUUID();
    sent.push({ key, token: poster.token, body });
    return { ...request, headers: { ...request.headers, authorization: `Bearer ${poster.token}`, "idempotency-key": key }, body };
  };

  const result = await autocannon({
    url: `http://127.0.0.1:${APP_PORT}`,
    connections: CONNECTIONS,
    duration: DURATION,
    requests: [{ method: "POST", path: "/api/v1/checks", headers: { "content-type": "application/json" }, setupRequest: nextRequest, onResponse: (status) => statuses.set(status, (statuses.get(status) ?? 0) + 1) }],
  });

  await stopServer();
  const keys = sent.map((s) => s.key);
  const [rows] = await db.select({ rows: count(), keys: countDistinct(checks.idempotencyKey) }).from(checks).where(eq(checks.source, "api"));
  let matched = 0;
  for (let i = 0; i < keys.length; i += 5000) {
    const [{ n }] = await db.select({ n: count() }).from(checks).where(inArray(checks.idempotencyKey, keys.slice(i, i + 5000)));
    matched += n;
  }
  await db.$client.end();
  const errors = result.errors + result.timeouts + result.non2xx;
  console.log(`\n${CONNECTIONS} connections for ${DURATION} s against the production build on 127.0.0.1:${APP_PORT}`);
  console.log(`Requests: ${result.requests.total.toLocaleString("en-GB")} (${fresh.toLocaleString("en-GB")} fresh keys, ${retries.toLocaleString("en-GB")} retries of earlier keys)`);
  console.log(`Throughput: ${result.requests.average.toFixed(1)} req/s on average`);
  console.log(`Latency: p50 ${result.latency.p50} ms, p99 ${result.latency.p99} ms`);
  console.log(`Status codes: ${[...statuses].sort(([a], [b]) => a - b).map(([s, n]) => `${s}×${n}`).join(", ")}`);
  console.log(`Errors: ${errors} (connection ${result.errors}, timeouts ${result.timeouts}, non-2xx ${result.non2xx}) — must be 0`);
  console.log(`Rows afterwards: ${rows.rows} API checks, ${rows.keys} distinct keys, ${matched} rows for the ${keys.length} keys sent — ${rows.rows === rows.keys && matched <= keys.length ? "no key stored twice" : "DUPLICATES FOUND"}`);
  if (errors > 0 || rows.rows !== rows.keys) process.exitCode = 1;
} finally {
  await stopServer();
  await smtp?.stop();
  cluster.stop();
  removeCluster(path.join(work, "postgres"));
  await rm(work, { recursive: true, force: true });
}
