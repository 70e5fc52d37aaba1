// The words of the daily digest and the expiry reminders; pure, so tests read exactly what a person receives.
import type { DueState } from "./schedule";

export interface DigestPlan {
  assetTag: string;
  checkType: string;
  dueOn: string;
  state: DueState;
  daysOverdue: number;
  roomName: string | null;
}

export interface ReminderItem {
  kind: "training" | "weight";
  /** "Rhea Castellane · repeatability" or "AVP-W-04 (100 g, E2)". */
  label: string;
  expiresOn: string;
  daysLeft: number;
}

export const DIGEST_HOUR = 6;

export function digestMessage(site: { code: string; name: string }, localDate: string, plans: DigestPlan[], appUrl: string) {
  const overdue = plans.filter((p) => p.state === "overdue").sort((a, b) => b.daysOverdue - a.daysOverdue);
  const week = plans.filter((p) => p.state === "due_today" || p.state === "due_this_week").sort((a, b) => a.dueOn.localeCompare(b.dueOn));
  const line = (p: DigestPlan) => `  - ${p.assetTag} ${p.checkType}${p.roomName ? ` (${p.roomName})` : ""}: due ${p.dueOn}${p.state === "overdue" ? `, ${p.daysOverdue} day(s) overdue` : ""}`;
  const text = [
    `Routine checks at ${site.code} · ${site.name}, ${localDate} (site time).`,
    "",
    `Overdue: ${overdue.length}`,
    ...overdue.map(line),
    "",
    `Due this week: ${week.length}`,
    ...week.map(line),
    "",
    `Schedule: ${appUrl}/schedule`,
    `To stop these e-mails: ${appUrl}/schedule/email`,
  ].join("\n");
  return { subject: `${site.code} checks ${localDate}: ${overdue.length} overdue, ${week.length} due this week`, text, empty: overdue.length + week.length === 0 };
}

/** 30 days before, 7 days before and once expired: each stage is reminded once. */
export function reminderStage(daysLeft: number): "30d" | "7d" | "expired" | null {
  if (daysLeft < 0) return "expired";
  if (daysLeft <= 7) return "7d";
  if (daysLeft <= 30) return "30d";
  return null;
}

export function reminderMessage(site: { code: string }, localDate: string, items: ReminderItem[], appUrl: string) {
  const line = (i: ReminderItem) => `  - ${i.kind === "training" ? "Training" : "Weight certificate"} ${i.label}: ${i.daysLeft < 0 ? `expired on ${i.expiresOn}` : `expires on ${i.expiresOn} (in ${i.daysLeft} day(s))`}`;
  const text = [
    `Expiring records at ${site.code}, ${localDate} (site time).`,
    "",
    ...items.map(line),
    "",
    "An expired training record blocks that person from recording the check; an expired weight cannot be chosen for a check.",
    `Training: ${appUrl}/training · Test weights: ${appUrl}/weights`,
    `To stop these e-mails: ${appUrl}/schedule/email`,
  ].join("\n");
  return { subject: `${site.code}: ${items.length} training record(s) or weight certificate(s) expiring`, text };
}
