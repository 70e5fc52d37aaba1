// Builds the app and serves it with its own database and its own identity and mail fakes,
// never the development server or its data.
import { spawn, spawnSync } from "node:child_process";
import path from "node:path";
import type { TestProject } from "vitest/node";
import { appEnvironment } from "../../scripts/lib/app-env";
import { dropDatabase, ensureDatabase } from "../../scripts/lib/database";
import { startIdentityProvider } from "../../scripts/fakes/identity-provider";
import { startSmtpFake } from "../../scripts/fakes/smtp";

declare module "vitest" {
  export interface ProvidedContext {
    baseUrl: string;
    outbox: string;
  }
}

const root = path.resolve(import.meta.dirname, "../..");

export default async function setup(project: TestProject) {
  const pgPort = Number(process.env.TEST_PGPORT ?? 54339);
  const adminUrl = `postgres://tareline@127.0.0.1:${pgPort}/postgres`;
  const appPort = Number(process.env.E2E_PORT ?? 3100);
  const idpPort = Number(process.env.E2E_IDP_PORT ?? 9410);
  const smtpPort = Number(process.env.E2E_SMTP_PORT ?? 2535);
  const outbox = path.join(root, `.data/test-outbox-${appPort}`);

  const buildDir = `.data/e2e-build-${appPort}`;
  if (process.env.E2E_SKIP_BUILD !== "1") {
    const build = spawnSync(process.execPath, [path.join(root, "node_modules/.bin/react-router"), "build"], { cwd: root, stdio: ["ignore", "ignore", "inherit"], env: { ...process.env, BUILD_DIR: buildDir } });
    if (build.status !== 0) throw new Error("react-router build failed");
  }
  await dropDatabase(adminUrl, "tareline_e2e");
  await ensureDatabase(adminUrl, "tareline_e2e", "tareline_template");
  const idp = await startIdentityProvider({ port: idpPort });
  const smtp = await startSmtpFake({ port: smtpPort, outbox });
  const env = appEnvironment({ databaseUrl: adminUrl.replace(/\/postgres$/, "/tareline_e2e"), appPort, idpPort, smtpPort, secret: "e2e-session-secret-0123456789", outbox });
  const server = spawn(process.execPath, [path.join(root, "node_modules/.bin/react-router-serve"), path.join(root, buildDir, "server/index.js")], {
    cwd: root,
    env: { ...process.env, ...env, NODE_ENV: "production" },
    stdio: ["ignore", "ignore", "inherit"],
  });
  const baseUrl = `http://localhost:${appPort}`;
  await waitFor(`${baseUrl}/healthz`);
  project.provide("baseUrl", baseUrl);
  project.provide("outbox", outbox);
  return async () => {
    // The server may hold open connections (a job queue, idle pools); it gets five seconds, then it is killed.
    const exited = new Promise((resolve) => server.once("exit", resolve));
    server.kill("SIGTERM");
    const timer = setTimeout(() => server.kill("SIGKILL"), 5_000);
    await exited;
    clearTimeout(timer);
    await idp.stop();
    await smtp.stop();
  };
}

async function waitFor(url: string) {
  for (let i = 0; i < 120; i++) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not come up`);
}
