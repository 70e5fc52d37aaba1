// The programme's background work on a PostgreSQL-backed queue (pg-boss, own schema in the same database):
// a tick every 10 minutes queues each site's digest and reminders once its local morning has come; jobs retry
// with back-off, and a restart picks up whatever was queued. The notifications table keeps a send to once a day.
import PgBoss from "pg-boss";
import { sites } from "../../db/schema";
import { createDatabase, type Database } from "./db.server";
import { DIGEST_HOUR } from "./digest";
import { sendSiteDigest, sendSiteReminders, type Send } from "./digest.server";
import { localDate, localHour } from "./schedule";

export const QUEUES = { tick: "programme-tick", digest: "site-digest", reminders: "site-reminders" } as const;

interface SiteJob {
  siteId: number;
  localDate: string;
}

export interface JobsOptions {
  databaseUrl: string;
  appUrl: string;
  send: Send;
  clock?: () => Date;
  retryDelaySeconds?: number;
  pollingIntervalSeconds?: number;
  /** Queue a tick at start, so a morning missed while the server was down is caught up (default true). */
  tickOnStart?: boolean;
}

export interface Jobs {
  boss: PgBoss;
  /** Runs the scheduler's tick now (the cron does the same every 10 minutes). */
  tick(): Promise<void>;
  stop(): Promise<void>;
}

export async function startJobs(options: JobsOptions): Promise<Jobs> {
  const clock = options.clock ?? (() => new Date());
  const db: Database = createDatabase(options.databaseUrl, 3);
  const boss = new PgBoss({ connectionString: options.databaseUrl, schema: "pgboss", application_name: "tareline-jobs", max: 4 });
  boss.on("error", (error) => console.error("Job queue:", error.message));
  await boss.start();
  const retry = { retryLimit: 6, retryDelay: options.retryDelaySeconds ?? 60, retryBackoff: true };
  await boss.createQueue(QUEUES.tick, { name: QUEUES.tick, policy: "singleton" });
  await boss.createQueue(QUEUES.digest, { name: QUEUES.digest, policy: "stately", ...retry });
  await boss.createQueue(QUEUES.reminders, { name: QUEUES.reminders, policy: "stately", ...retry });

  const tick = async () => {
    const now = clock();
    for (const site of await db.select().from(sites)) {
      if (localHour(now, site.timeZone) < DIGEST_HOUR) continue;
      const data: SiteJob = { siteId: site.id, localDate: localDate(now, site.timeZone) };
      const key = `${data.siteId}:${data.localDate}`;
      await boss.send(QUEUES.digest, data, { singletonKey: key, ...retry });
      await boss.send(QUEUES.reminders, data, { singletonKey: key, ...retry });
    }
  };
  const polling = { pollingIntervalSeconds: options.pollingIntervalSeconds ?? 2 };
  await boss.work(QUEUES.tick, polling, async () => tick());
  await boss.work<SiteJob>(QUEUES.digest, polling, async ([job]) => {
    await sendSiteDigest(db, { ...job.data, now: clock(), appUrl: options.appUrl, send: options.send });
  });
  await boss.work<SiteJob>(QUEUES.reminders, polling, async ([job]) => {
    await sendSiteReminders(db, { ...job.data, appUrl: options.appUrl, send: options.send });
  });
  await boss.schedule(QUEUES.tick, "*/10 * * * *");
  if (options.tickOnStart ?? true) await boss.send(QUEUES.tick, {});
  return {
    boss,
    tick: async () => void (await boss.send(QUEUES.tick, {})),
    stop: async () => {
      await boss.stop({ graceful: true, wait: true, timeout: 10_000 });
      await db.$client.end();
    },
  };
}
