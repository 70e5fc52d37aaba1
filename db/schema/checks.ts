import {
  boolean,
  bigint,
  doublePrecision,
  index,
  integer,
  jsonb,
  numeric,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
} from "drizzle-orm/pg-core";
import {
  checkSourceEnum,
  checkTypeEnum,
  eccentricityPositionEnum,
  guardBandPolicyEnum,
  massUnitEnum,
  outcomeEnum,
  toleranceBasisEnum,
} from "./enums";
import { instruments } from "./instruments";
import { users } from "./people";
import { testWeights } from "./weights";

export const checkPlans = pgTable(
  "check_plans",
  {
    id: integer().primaryKey().generatedAlwaysAsIdentity(),
    instrumentId: integer().notNull().references(() => instruments.id),
    checkType: checkTypeEnum().notNull(),
    intervalDays: integer().notNull(),
    toleranceBasis: toleranceBasisEnum().notNull(),
    // absolute: grams; percent_of_load: percent; usp41 and oiml_r76_in_service: derived, null here.
    toleranceValue: numeric(),
    guardBandPolicy: guardBandPolicyEnum().notNull().default("fraction_of_tolerance"),
    guardBandFraction: numeric().notNull().default("0.3333333333"),
    loadG: numeric(),
    repetitions: integer(),
    safetyFactor: numeric().notNull().default("2"),
    riskAssessment: jsonb(),
    active: boolean().notNull().default(true),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("check_plans_instrument_type_uq").on(t.instrumentId, t.checkType)],
);

export const checkPlanWeights = pgTable(
  "check_plan_weights",
  {
    planId: integer().notNull().references(() => checkPlans.id),
    weightId: integer().notNull().references(() => testWeights.id),
  },
  (t) => [primaryKey({ columns: [t.planId, t.weightId] })],
);

export const checks = pgTable(
  "checks",
  {
    id: bigint({ mode: "number" }).primaryKey().generatedAlwaysAsIdentity(),
    instrumentId: integer().notNull().references(() => instruments.id),
    checkType: checkTypeEnum().notNull(),
    planId: integer().references(() => checkPlans.id),
    weightId: integer().references(() => testWeights.id),
    operatorId: integer().notNull().references(() => users.id),
    performedAt: timestamp({ withTimezone: true }).notNull(),
    recordedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    unit: massUnitEnum().notNull(),
    // Computed by the engine on the server from the readings, in grams.
    resultG: doublePrecision().notNull(),
    expandedUncertaintyG: doublePrecision(),
    toleranceG: doublePrecision(),
    acceptanceG: doublePrecision(),
    outcome: outcomeEnum().notNull(),
    // How the requirement was derived and the engine's intermediate figures (E, s, m_min, ΔI per position…).
    basis: text().notNull().default(""),
    details: jsonb().$type<Record<string, number | string | boolean | null>>(),
    source: checkSourceEnum().notNull(),
    idempotencyKey: text(),
    // Hash of instrument, type, time and readings: the same check arriving twice (a re-import) is stored once.
    dedupeKey: text(),
    requestHash: text(),
    importId: integer(),
    note: text().notNull().default(""),
    // The readings as entered, in order, space-separated ("position=value" for eccentricity), written with the check by
    // readings_as_entered() from the same values as check_readings. A copy, so an export of a million checks needs no
    // lookup per row (docs/decisions/011); check_readings stays the record.
    readingsEntered: text(),
    // A correction is a new row pointing at the one it replaces; the old row is kept.
    correctsCheckId: bigint({ mode: "number" }),
    correctionReason: text(),
    supersededAt: timestamp({ withTimezone: true }),
  },
  (t) => [
    index("checks_series_idx").on(t.instrumentId, t.checkType, t.performedAt),
    index("checks_performed_idx").on(t.performedAt),
    uniqueIndex("checks_idempotency_uq").on(t.operatorId, t.idempotencyKey),
    uniqueIndex("checks_dedupe_uq").on(t.dedupeKey),
  ],
);

export const checkReadings = pgTable(
  "check_readings",
  {
    checkId: bigint({ mode: "number" }).notNull().references(() => checks.id),
    ordinal: integer().notNull(),
    position: eccentricityPositionEnum(),
    // Exactly as entered, in the check's unit.
    value: numeric().notNull(),
  },
  (t) => [primaryKey({ columns: [t.checkId, t.ordinal] })],
);

export type CheckPlan = typeof checkPlans.$inferSelect;
export type Check = typeof checks.$inferSelect;
export type CheckReading = typeof checkReadings.$inferSelect;

// Opened by an out-of-tolerance check: every check and day of use since the last passing check of that type.
export const impactReviews = pgTable(
  "impact_reviews",
  {
    id: integer().primaryKey().generatedAlwaysAsIdentity(),
    instrumentId: integer().notNull().references(() => instruments.id),
    failedCheckId: bigint({ mode: "number" }).notNull().references(() => checks.id),
    checkType: checkTypeEnum().notNull(),
    lastPassingAt: timestamp({ withTimezone: true }),
    checksSince: integer().notNull(),
    daysOfUse: integer().notNull(),
    openedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    closedAt: timestamp({ withTimezone: true }),
    closedById: integer().references(() => users.id),
    conclusion: text(),
  },
  (t) => [index("impact_reviews_instrument_idx").on(t.instrumentId, t.openedAt)],
);

export type ImpactReview = typeof impactReviews.$inferSelect;
