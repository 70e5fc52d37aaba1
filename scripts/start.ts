// `npm start`: PostgreSQL on loopback, migrations, demo data, the identity and mail fakes, then the app.
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import path from "node:path";
import { createDatabase } from "../app/lib/db.server";
import { DEMO_PEOPLE } from "../db/seed/people";
import { seedDemo } from "../db/seed/seed";
import { ROLE_LABELS } from "../app/lib/permissions";
import { appEnvironment, sessionSecret } from "./lib/app-env";
import { ensureDatabase, runMigrations } from "./lib/database";
import { writeDemoFile } from "./lib/demo-file";
import { startCluster } from "./lib/postgres";
import { startIdentityProvider } from "./fakes/identity-provider";
import { startSmtpFake } from "./fakes/smtp";

const root = path.resolve(import.meta.dirname, "..");
const dataDir = path.join(root, ".data");
const port = (name: string, fallback: number) => Number(process.env[name] ?? fallback);
const step = (text: string) => console.log(`▸ ${text}`);

const pgPort = port("PGPORT", 54329);
const appPort = port("PORT", 3000);
const idpPort = port("IDP_PORT", 9400);
const smtpPort = port("SMTP_PORT", 2525);

step(`PostgreSQL: cluster in .data/postgres on 127.0.0.1:${pgPort}`);
const cluster = startCluster({ dataDir: path.join(dataDir, "postgres"), port: pgPort, database: "tareline", log: (l) => console.log(`  ${l}`) });
const stops: (() => unknown)[] = [() => cluster.stop()];
let server: ChildProcess | undefined;

let stopping = false;
async function shutdown(code: number) {
  if (stopping) return;
  stopping = true;
  if (server?.pid && server.exitCode === null) {
    const exited = new Promise((resolve) => server!.once("exit", resolve));
    server.kill("SIGTERM");
    const timer = setTimeout(() => server?.kill("SIGKILL"), 5_000);
    await exited;
    clearTimeout(timer);
  }
  for (const stop of stops.reverse()) await stop();
  process.exit(code);
}
process.on("SIGINT", () => void shutdown(0));
process.on("SIGTERM", () => void shutdown(0));

try {
  if (await ensureDatabase(cluster.adminUrl, "tareline")) step("Database tareline created");
  step("Applying migrations");
  await runMigrations(cluster.url);
  const db = createDatabase(cluster.url, 2);
  // A fresh demo is seeded as of now, so its stories (the drifting balance's forecast, the overdue plans) are
  // current on first sight; set TARELINE_DEMO_DATE to replay it as of another moment.
  process.env.TARELINE_DEMO_DATE ??= new Date().toISOString();
  const seeded = await seedDemo(db);
  step(seeded.created ? `Demo data seeded as of ${process.env.TARELINE_DEMO_DATE.slice(0, 10)} (${seeded.instruments} instruments)` : "Demo data already present (nothing added)");
  const demo = await writeDemoFile(db, path.join(dataDir, "demo.json"), `http://localhost:${appPort}`);
  await db.$client.end();
  step("Demo people and their API tokens are in .data/demo.json");

  const idp = await startIdentityProvider({ port: idpPort });
  stops.push(idp.stop);
  step(`Identity-provider fake on ${idp.issuer}`);
  const outbox = path.join(dataDir, "outbox");
  const smtp = await startSmtpFake({ port: smtpPort, outbox });
  stops.push(smtp.stop);
  step(`SMTP fake on 127.0.0.1:${smtpPort} (messages in .data/outbox)`);

  if (!process.argv.includes("--no-build")) {
    step("Building the app (react-router build)");
    const build = spawnSync(process.execPath, [path.join(root, "node_modules/.bin/react-router"), "build"], { cwd: root, stdio: ["ignore", "ignore", "inherit"] });
    if (build.status !== 0) throw new Error("The build failed; see the messages above.");
  }
  const env = appEnvironment({ databaseUrl: cluster.url, appPort, idpPort, smtpPort, secret: sessionSecret(dataDir), outbox });
  // Started as node + the script so the PID we hold is the server's own.
  server = spawn(process.execPath, [path.join(root, "node_modules/.bin/react-router-serve"), path.join(root, "build/server/index.js")], {
    cwd: root,
    env: { ...process.env, ...env },
    stdio: ["ignore", "inherit", "inherit"],
  });
  server.on("exit", (code) => {
    console.log(`The app server stopped (exit ${code}).`);
    void shutdown(code ?? 1);
  });
  await waitForHealth(`http://localhost:${appPort}/healthz`);
  step(`Tareline is ready on http://localhost:${appPort}  (Ctrl-C stops everything)`);
  console.log("  Demo people (sign in from the sign-in page):");
  for (const p of DEMO_PEOPLE) console.log(`    ${p.name.padEnd(20)} ${ROLE_LABELS[p.role].padEnd(15)} ${p.siteCodes.join(",").padEnd(12)} ${p.email}`);
  void demo;
} catch (error) {
  console.error(`\nStart failed: ${error instanceof Error ? error.message : String(error)}`);
  await shutdown(1);
}

async function waitForHealth(url: string) {
  for (let i = 0; i < 120; i++) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`${url} did not answer within 60 s.`);
}
