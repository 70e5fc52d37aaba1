// Sends each person's digest and reminders at most once: the notification row is the claim, sent_at the proof.
import { and, eq, inArray, isNull, sql } from "drizzle-orm";
import { memberships, notifications, sites, testWeights, trainingRecords, users } from "../../db/schema";
import { listPlanSchedule } from "../queries/schedule.server";
import type { Database } from "./db.server";
import { digestMessage, reminderMessage, reminderStage, type ReminderItem } from "./digest";
import { daysBetween } from "./schedule";

export type Send = (message: { to: string[]; subject: string; text: string }) => Promise<void>;

async function recipients(db: Database, siteId: number, roles: ("site_manager" | "metrologist")[]) {
  return db
    .select({ id: users.id, email: users.email, name: users.name })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.siteId, siteId), inArray(memberships.role, roles), eq(users.active, true), eq(users.digestsEnabled, true)));
}

/** Claims (user, key), sends, marks sent, all in one transaction: a failed send leaves nothing claimed, so a retry sends it. */
async function sendOnce(db: Database, send: Send, person: { id: number; email: string }, items: { key: string; kind: string }[], message: { subject: string; text: string }): Promise<boolean> {
  return db.transaction(async (tx) => {
    await tx.insert(notifications).values(items.map((i) => ({ userId: person.id, kind: i.kind, subject: message.subject, body: message.text, episodeKey: i.key }))).onConflictDoNothing();
    const open = await tx
      .select({ id: notifications.id })
      .from(notifications)
      .where(and(eq(notifications.userId, person.id), inArray(notifications.episodeKey, items.map((i) => i.key)), isNull(notifications.sentAt)))
      .for("update", { skipLocked: true });
    if (open.length === 0) return false;
    await send({ to: [person.email], subject: message.subject, text: message.text });
    await tx.update(notifications).set({ sentAt: new Date() }).where(inArray(notifications.id, open.map((o) => o.id)));
    return true;
  });
}

async function siteRow(db: Database, siteId: number) {
  const [site] = await db.select().from(sites).where(eq(sites.id, siteId));
  if (!site) throw new Error(`No site ${siteId}`);
  return site;
}

/** The site's managers get overdue and due-this-week plans for the site-local day `localDate`; nothing to report sends nothing. */
export async function sendSiteDigest(db: Database, params: { siteId: number; localDate: string; now: Date; appUrl: string; send: Send }) {
  const site = await siteRow(db, params.siteId);
  const plans = await listPlanSchedule(db, null, params.now, { siteId: site.id });
  const message = digestMessage(site, params.localDate, plans.map((p) => ({ assetTag: p.assetTag, checkType: p.checkType, dueOn: p.due.dueOn, state: p.due.state, daysOverdue: p.due.daysOverdue, roomName: p.roomName })), params.appUrl);
  if (message.empty) return 0;
  let sent = 0;
  for (const person of await recipients(db, site.id, ["site_manager"])) {
    if (await sendOnce(db, params.send, person, [{ key: `digest:${site.id}:${params.localDate}`, kind: "digest" }], message)) sent++;
  }
  return sent;
}

/** Training records of the site's people and the site's weight certificates, at the 30-day, 7-day and expired stages. */
export async function sendSiteReminders(db: Database, params: { siteId: number; localDate: string; appUrl: string; send: Send }) {
  const site = await siteRow(db, params.siteId);
  const horizon = sql`${params.localDate}::date + 30`;
  const training = await db
    .select({ id: trainingRecords.id, userId: trainingRecords.userId, procedure: trainingRecords.procedure, expiresOn: trainingRecords.expiresOn, name: users.name })
    .from(trainingRecords)
    .innerJoin(users, eq(users.id, trainingRecords.userId))
    .innerJoin(memberships, and(eq(memberships.userId, trainingRecords.userId), eq(memberships.siteId, site.id)))
    .where(and(eq(users.active, true), sql`${trainingRecords.expiresOn} <= ${horizon}`));
  // A record already renewed by a later one for the same procedure is not reminded.
  const current = training.filter((t) => !training.some((o) => o.userId === t.userId && o.procedure === t.procedure && (o.expiresOn ?? "") > (t.expiresOn ?? "")));
  const weights = await db.select().from(testWeights).where(and(eq(testWeights.siteId, site.id), sql`${testWeights.dueOn} <= ${horizon}`));
  type Item = ReminderItem & { key: string; forUserId?: number };
  const items: Item[] = [
    ...current.map((t) => ({ kind: "training" as const, label: `${t.name} · ${t.procedure}`, expiresOn: t.expiresOn!, daysLeft: daysBetween(params.localDate, t.expiresOn!), key: `training:${t.id}`, forUserId: t.userId })),
    ...weights.map((w) => ({ kind: "weight" as const, label: `${w.identifier} (${w.nominalG} g, ${w.weightClass}), certificate ${w.certificateNumber}`, expiresOn: w.dueOn, daysLeft: daysBetween(params.localDate, w.dueOn), key: `weight:${w.id}:${w.dueOn}` })),
  ]
    .map((i) => ({ ...i, stage: reminderStage(i.daysLeft) }))
    .filter((i) => i.stage !== null)
    .map((i) => ({ ...i, key: `reminder:${i.key}:${i.stage}` }));
  if (!items.length) return 0;
  const metrologists = await recipients(db, site.id, ["metrologist"]);
  const trainees = await db.select({ id: users.id, email: users.email, name: users.name }).from(users).where(and(inArray(users.id, [...new Set(items.flatMap((i) => (i.forUserId ? [i.forUserId] : [])))].concat(-1)), eq(users.digestsEnabled, true), eq(users.active, true)));
  let sent = 0;
  for (const person of [...new Map([...metrologists, ...trainees].map((p) => [p.id, p])).values()]) {
    const mine = metrologists.some((m) => m.id === person.id) ? items : items.filter((i) => i.forUserId === person.id);
    const fresh = await unsent(db, person.id, mine.map((i) => i.key));
    const due = mine.filter((i) => fresh.has(i.key));
    if (!due.length) continue;
    if (await sendOnce(db, params.send, person, due.map((i) => ({ key: i.key, kind: "reminder" })), reminderMessage(site, params.localDate, due, params.appUrl))) sent++;
  }
  return sent;
}

/** Keys not yet sent to the person (never claimed, or claimed by an attempt whose mail failed). */
async function unsent(db: Database, userId: number, keys: string[]): Promise<Set<string>> {
  if (!keys.length) return new Set();
  const done = await db.select({ key: notifications.episodeKey }).from(notifications).where(and(eq(notifications.userId, userId), inArray(notifications.episodeKey, keys), sql`${notifications.sentAt} is not null`));
  return new Set(keys.filter((k) => !done.some((d) => d.key === k)));
}
