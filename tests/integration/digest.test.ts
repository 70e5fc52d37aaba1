// The daily digest runs on the real job queue (pg-boss in this test's database) and the real SMTP fake.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "../../app/lib/db.server";
import { startJobs, type Jobs } from "../../app/lib/jobs.server";
import { sendMail } from "../../app/lib/mail.server";
import { users } from "../../db/schema";
import { startOutbox } from "../helpers/mail";
import { SITE_MANAGER } from "../helpers/people";

let outbox: Awaited<ReturnType<typeof startOutbox>>;
let jobs: Jobs | null = null;
let now = new Date("2026-12-02T09:00:00Z"); // 09:00 London, 10:00 Berlin, 03:00 Chicago (before its digest hour)

const start = () => startJobs({ databaseUrl: process.env.DATABASE_URL!, appUrl: "http://localhost:3999", send: sendMail, clock: () => now, retryDelaySeconds: 1, pollingIntervalSeconds: 0.5, tickOnStart: false });
// The SMTP fake keeps messages as sent: quoted-printable soft breaks and escapes are undone before reading.
const decoded = (raw: string) => raw.replace(/=\r?\n/g, "").replace(/=([0-9A-F]{2})((?:=[0-9A-F]{2})*)/g, (m) => Buffer.from(m.replaceAll("=", ""), "hex").toString("utf8"));
const subject = (raw: string) => /^Subject: (.*)$/m.exec(raw)?.[1] ?? "";
const to = (raw: string) => /^To: (.*)$/m.exec(raw)?.[1] ?? "";
const digests = () => outbox.messages().filter((m) => / checks \d{4}-\d{2}-\d{2}: /.test(subject(m)) && to(m).includes(SITE_MANAGER));
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function settle(expected: number, count: () => number, timeoutMs = 20_000) {
  const end = Date.now() + timeoutMs;
  while (count() < expected && Date.now() < end) await sleep(200);
  await sleep(2_500); // and nothing more arrives
  return count();
}

beforeAll(async () => {
  outbox = await startOutbox();
  jobs = await start();
});
afterAll(async () => {
  await jobs?.stop();
  await outbox.stop();
});

describe("the daily digest", () => {
  it("reaches the site manager once per site-local day, and not again on a second tick", async () => {
    await jobs!.tick();
    expect(await settle(2, () => digests().length)).toBe(2);
    expect(digests().map(subject).sort()).toEqual([expect.stringMatching(/^AVP checks 2026-12-02: \d+ overdue/), expect.stringMatching(/^QNW checks 2026-12-02: \d+ overdue/)]);
    expect(decoded(digests()[0])).toMatch(/To stop these e-mails: http:\/\/localhost:3999\/schedule\/email/);
    await jobs!.tick();
    expect(await settle(3, () => digests().length, 4_000)).toBe(2);
  });

  it("reminds the metrologist of an expired training record and a weight certificate falling due, once", async () => {
    const reminders = () => outbox.messages().filter((m) => /expiring$/.test(subject(m)));
    expect(await settle(1, () => reminders().length, 10_000)).toBeGreaterThanOrEqual(1);
    const qnw = reminders().find((m) => subject(m).startsWith("QNW"));
    expect(decoded(qnw ?? "")).toMatch(/Rhea Castellane · repeatability: expired on/);
    const avp = reminders().find((m) => subject(m).startsWith("AVP"));
    expect(decoded(avp ?? "")).toMatch(/Weight certificate AVP-W-04 .*expires on 2026-12-15 \(in 13 day\(s\)\)/);
  });

  it("is not sent again after the queue restarts the same day, and is sent again the next day", async () => {
    await jobs!.stop();
    jobs = await start();
    await jobs.tick();
    expect(await settle(3, () => digests().length, 5_000)).toBe(2);
    now = new Date("2026-12-03T09:00:00Z");
    await jobs.tick();
    expect(await settle(4, () => digests().length)).toBe(4);
  });

  it("retries while the mail server is down, and delivers exactly once when it is back", async () => {
    await outbox.stop();
    now = new Date("2026-12-04T09:00:00Z");
    await jobs!.tick();
    await sleep(3_000);
    outbox = await startOutbox();
    expect(await settle(2, () => digests().length, 30_000)).toBe(2);
    expect(digests().every((m) => subject(m).includes("2026-12-04"))).toBe(true);
  });

  it("is not sent to a person who turned digests off", async () => {
    await db().update(users).set({ digestsEnabled: false }).where(eq(users.email, SITE_MANAGER));
    now = new Date("2026-12-05T09:00:00Z");
    await jobs!.tick();
    expect(await settle(1, () => digests().filter((m) => subject(m).includes("2026-12-05")).length, 5_000)).toBe(0);
  });

});
