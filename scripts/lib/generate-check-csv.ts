// Writes a large check-history CSV in Tareline's own format for the in-service balances of a seeded database:
// readings on the plan's weight to the instrument's d, so every row passes, and unique times so none repeats.
// Streams to disk with back-pressure; only one block of rows is ever in memory.
import { once } from "node:events";
import { createWriteStream } from "node:fs";
import { and, asc, eq, inArray } from "drizzle-orm";
import type { Database } from "../../app/lib/db.server";
import { checkPlans, checkPlanWeights, instruments, testWeights } from "../../db/schema";
import type { CheckType } from "../../db/schema/enums";
import { seededRandom } from "../../db/seed/random";
import { evaluateCheck } from "../../app/lib/check-evaluation";
import { parseReadings } from "../../app/lib/check-readings";
import { instrumentSpec, requirementSpec, weightSpec } from "../../app/queries/check-context.server";

export const CSV_HEADER = "asset_tag,check_type,performed_at,unit,weight,readings,operator_email,note\n";
const BALANCES = ["micro_balance", "semi_micro_balance", "analytical_balance", "precision_balance"] as const;
const BLOCK_ROWS = 2000;

export interface GeneratorTarget {
  assetTag: string;
  type: CheckType;
  weight: string;
  loadG: number;
  decimals: number;
}

/** Every in-service balance × plan whose weight suits it, judged by the engine on a reading right on the weight. */
export async function loadTargets(db: Database): Promise<GeneratorTarget[]> {
  const rows = await db
    .select({ instrument: instruments, plan: checkPlans, weight: testWeights })
    .from(checkPlans)
    .innerJoin(instruments, eq(instruments.id, checkPlans.instrumentId))
    .innerJoin(checkPlanWeights, eq(checkPlanWeights.planId, checkPlans.id))
    .innerJoin(testWeights, eq(testWeights.id, checkPlanWeights.weightId))
    .where(and(eq(instruments.status, "in_service"), inArray(instruments.kind, [...BALANCES]), eq(checkPlans.active, true)))
    .orderBy(asc(instruments.assetTag), asc(checkPlans.checkType), asc(testWeights.nominalG));
  const byPlan = new Map<number, (typeof rows)[number]>();
  for (const r of rows) byPlan.set(r.plan.id, r);
  return [...byPlan.values()].flatMap(({ instrument, plan, weight }) => {
    const decimals = Math.max(0, instrument.readabilityG.split(".")[1]?.length ?? 0);
    const loadG = Number(plan.checkType === "repeatability" ? weight.nominalG : weight.conventionalMassG);
    const reading = loadG.toFixed(decimals);
    const input = plan.checkType === "eccentricity" ? Object.fromEntries(["centre", "front-left", "back-left", "back-right", "front-right"].map((p) => [p, reading])) : Array.from({ length: plan.checkType === "repeatability" ? 10 : 1 }, () => reading);
    const parsed = parseReadings(input, { type: plan.checkType, unit: "g", readabilityG: instrument.readabilityG });
    if (!parsed.ok) return [];
    const judged = evaluateCheck({ type: plan.checkType, instrument: instrumentSpec(instrument), requirement: requirementSpec(plan), weight: plan.checkType === "repeatability" ? null : weightSpec(weight), readings: parsed.readings, checkDate: "2025-06-01" });
    return judged.ok && judged.evaluation.outcome === "in_tolerance" ? [{ assetTag: instrument.assetTag, type: plan.checkType, weight: weight.identifier, loadG, decimals }] : [];
  });
}

// Sensitivity checks are the frequent ones (daily or weekly); repeatability and eccentricity come less often.
const TYPE_PATTERN: CheckType[] = ["sensitivity", "sensitivity", "repeatability", "sensitivity", "sensitivity", "eccentricity", "sensitivity", "sensitivity", "repeatability", "sensitivity"];

function readings(t: GeneratorTarget, random: () => number): string {
  const d = 10 ** -t.decimals;
  const one = () => (t.loadG + Math.round((random() - 0.5) * 2) * d).toFixed(t.decimals);
  if (t.type === "sensitivity") return one();
  const centre = one();
  if (t.type === "eccentricity") return [centre, one(), one(), one(), one()].join("|");
  return Array.from({ length: 10 }, one).join("|");
}

export interface GenerateOptions {
  rows: number;
  targets: GeneratorTarget[];
  /** Times run from `from` to `to` (both in the past), evenly spaced, one row per step. */
  from: Date;
  to: Date;
  seed?: number;
  /** Characters of note per row (0: none), to make a file of a given size. */
  noteChars?: number;
  /** A last line written as given, e.g. a deliberately bad row. */
  lastLine?: string;
}

export async function writeCheckCsv(file: string, options: GenerateOptions): Promise<{ rows: number; bytes: number }> {
  const out = createWriteStream(file);
  const random = seededRandom(options.seed ?? 20261201);
  const step = (options.to.getTime() - options.from.getTime()) / Math.max(1, options.rows);
  const note = options.noteChars ? "Routine check recorded in the weighing-room log; imported with the site's history. ".repeat(Math.ceil(options.noteChars / 84)).slice(0, options.noteChars) : "";
  const byType = new Map(TYPE_PATTERN.map((type) => [type, options.targets.filter((t) => t.type === type)]));
  const next = new Map<CheckType, number>();
  let bytes = 0;
  const write = async (text: string) => {
    bytes += Buffer.byteLength(text);
    if (!out.write(text)) await once(out, "drain");
  };
  await write(CSV_HEADER);
  for (let start = 0; start < options.rows; start += BLOCK_ROWS) {
    let block = "";
    for (let i = start; i < Math.min(options.rows, start + BLOCK_ROWS); i++) {
      const type = TYPE_PATTERN[i % TYPE_PATTERN.length];
      const pool = byType.get(type)?.length ? byType.get(type)! : options.targets;
      const k = next.get(type) ?? 0;
      next.set(type, k + 1);
      const t = pool[k % pool.length];
      const at = new Date(Math.floor((options.from.getTime() + i * step) / 1000) * 1000).toISOString().replace(".000Z", "Z");
      block += `${t.assetTag},${t.type},${at},g,${t.weight},${readings(t, random)},,${note}\n`;
    }
    await write(block);
  }
  if (options.lastLine) await write(`${options.lastLine}\n`);
  out.end();
  await once(out, "finish");
  return { rows: options.rows + (options.lastLine ? 1 : 0), bytes };
}
