// A new drift signal, or a forecast reaching the tolerance within 30 days, is worth one message per episode,
// not one per check: the episode key names the series and the check where the episode began.
import { and, eq } from "drizzle-orm";
import { memberships, notifications, seriesSummaries, users } from "../../db/schema";
import type { CheckType } from "../../db/schema/enums";
import type { DbOrTx } from "../lib/db.server";
import { describeSignal } from "../lib/signal-advice";

const SOON_MS = 30 * 86_400_000;

export async function previousSummary(db: DbOrTx, instrumentId: number, type: CheckType) {
  const [row] = await db.select().from(seriesSummaries).where(and(eq(seriesSummaries.instrumentId, instrumentId), eq(seriesSummaries.checkType, type)));
  return row ?? null;
}

function forecastWithin(forecast: unknown, now: Date): string | null {
  const f = forecast as { toleranceAt?: unknown; earliestToleranceAt?: unknown } | null;
  const at = typeof f?.earliestToleranceAt === "string" ? f.earliestToleranceAt : typeof f?.toleranceAt === "string" ? f.toleranceAt : null;
  if (!at) return null;
  const ms = Date.parse(at);
  return ms > now.getTime() && ms - now.getTime() <= SOON_MS ? at : null;
}

export async function notifyDrift(
  db: DbOrTx,
  params: { instrument: { id: number; siteId: number; assetTag: string; ownerId: number | null }; type: CheckType; checkId: number; before: { activeSignals: string[]; forecast: unknown } | null; after: { activeSignals: string[]; forecast: unknown }; now: Date },
): Promise<number[]> {
  const { instrument, type, checkId, before, after, now } = params;
  const notes: { kind: string; subject: string; body: string; episodeKey: string }[] = [];
  if (after.activeSignals.length && !before?.activeSignals.length) {
    notes.push({
      kind: "drift_signal",
      subject: `${instrument.assetTag}: a ${type} drift signal`,
      body: `The latest ${type} check of ${instrument.assetTag} raised: ${after.activeSignals.map((s) => describeSignal(s).name).join("; ")}. ${describeSignal(after.activeSignals[0]).advice} The instrument stays in service; your quality system decides what follows.`,
      episodeKey: `drift_signal:${instrument.id}:${type}:${checkId}`,
    });
  }
  const soon = forecastWithin(after.forecast, now);
  if (soon && !forecastWithin(before?.forecast ?? null, now)) {
    notes.push({
      kind: "forecast",
      subject: `${instrument.assetTag}: ${type} forecast to reach the tolerance by ${soon.slice(0, 10)}`,
      body: `The ${type} trend of ${instrument.assetTag} is forecast to reach its tolerance by ${soon.slice(0, 10)} (95 % prediction bound). Plan an adjustment or a calibration, or shorten the check interval, under your quality system.`,
      episodeKey: `forecast:${instrument.id}:${type}:${checkId}`,
    });
  }
  if (!notes.length) return [];
  const people = await db.select({ id: users.id }).from(memberships).innerJoin(users, eq(users.id, memberships.userId)).where(and(eq(memberships.siteId, instrument.siteId), eq(memberships.role, "metrologist"), eq(users.active, true)));
  const ids = [...new Set([...people.map((p) => p.id), ...(instrument.ownerId ? [instrument.ownerId] : [])])];
  if (!ids.length) return [];
  const rows = await db.insert(notifications).values(notes.flatMap((n) => ids.map((userId) => ({ userId, instrumentId: instrument.id, ...n })))).returning({ id: notifications.id });
  return rows.map((r) => r.id);
}
