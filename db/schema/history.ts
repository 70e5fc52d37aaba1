import {
  bigint,
  boolean,
  date,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
} from "drizzle-orm/pg-core";
import { checkTypeEnum, eventKindEnum } from "./enums";
import { checks } from "./checks";
import { instruments } from "./instruments";
import { users } from "./people";

export const instrumentEvents = pgTable(
  "events",
  {
    id: integer().primaryKey().generatedAlwaysAsIdentity(),
    instrumentId: integer().notNull().references(() => instruments.id),
    kind: eventKindEnum().notNull(),
    occurredAt: timestamp({ withTimezone: true }).notNull(),
    note: text().notNull().default(""),
    createdById: integer().references(() => users.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("events_instrument_idx").on(t.instrumentId, t.occurredAt)],
);

export const pointAnnotations = pgTable(
  "point_annotations",
  {
    id: integer().primaryKey().generatedAlwaysAsIdentity(),
    checkId: bigint({ mode: "number" }).notNull().references(() => checks.id),
    excluded: boolean().notNull(),
    reason: text().notNull(),
    createdById: integer().notNull().references(() => users.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    withdrawnAt: timestamp({ withTimezone: true }),
  },
  (t) => [index("point_annotations_check_idx").on(t.checkId)],
);

// Refreshed on every write so the fleet view reads one row per series instead of recomputing.
export const seriesSummaries = pgTable(
  "series_summaries",
  {
    instrumentId: integer().notNull().references(() => instruments.id),
    checkType: checkTypeEnum().notNull(),
    computedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    lastCheckAt: timestamp({ withTimezone: true }),
    nextDueAt: timestamp({ withTimezone: true }),
    pointCount: integer().notNull().default(0),
    center: doublePrecision(),
    sigma: doublePrecision(),
    activeSignals: jsonb().$type<string[]>().notNull().default([]),
    trend: jsonb(),
    forecast: jsonb(),
    review: jsonb(),
  },
  (t) => [primaryKey({ columns: [t.instrumentId, t.checkType] }), index("series_summaries_due_idx").on(t.nextDueAt)],
);

export const trainingRecords = pgTable(
  "training_records",
  {
    id: integer().primaryKey().generatedAlwaysAsIdentity(),
    userId: integer().notNull().references(() => users.id),
    // sensitivity | repeatability | eccentricity, or a custom procedure name.
    procedure: text().notNull(),
    trainedOn: date().notNull(),
    trainerName: text().notNull(),
    expiresOn: date(),
    evidence: text().notNull().default(""),
    recordedById: integer().references(() => users.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("training_records_user_idx").on(t.userId, t.procedure), index("training_records_expiry_idx").on(t.expiresOn)],
);

export const notifications = pgTable(
  "notifications",
  {
    id: integer().primaryKey().generatedAlwaysAsIdentity(),
    userId: integer().notNull().references(() => users.id),
    kind: text().notNull(),
    subject: text().notNull(),
    body: text().notNull(),
    instrumentId: integer().references(() => instruments.id),
    // One notification per episode: the same key is never sent twice.
    episodeKey: text(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp({ withTimezone: true }),
    readAt: timestamp({ withTimezone: true }),
  },
  (t) => [index("notifications_user_idx").on(t.userId, t.createdAt), uniqueIndex("notifications_user_episode_uq").on(t.userId, t.episodeKey)],
);

export const imports = pgTable("imports", {
  id: integer().primaryKey().generatedAlwaysAsIdentity(),
  createdById: integer().notNull().references(() => users.id),
  filename: text().notNull(),
  status: text().notNull(),
  mapping: jsonb(),
  totalRows: integer().notNull().default(0),
  validRows: integer().notNull().default(0),
  rejectedRows: integer().notNull().default(0),
  duplicateRows: integer().notNull().default(0),
  bytesTotal: bigint({ mode: "number" }),
  bytesRead: bigint({ mode: "number" }).notNull().default(0),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  finishedAt: timestamp({ withTimezone: true }),
});

export const importMappings = pgTable("import_mappings", {
  id: integer().primaryKey().generatedAlwaysAsIdentity(),
  name: text().notNull().unique(),
  mapping: jsonb().$type<Record<string, string>>().notNull(),
  createdById: integer().notNull().references(() => users.id),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

export const importRowsRejected = pgTable(
  "import_rows_rejected",
  {
    importId: integer().notNull().references(() => imports.id),
    line: integer().notNull(),
    column: text(),
    reason: text().notNull(),
    raw: text(),
  },
  (t) => [index("import_rows_rejected_import_idx").on(t.importId, t.line)],
);

// Append-only: a trigger in the migrations rejects UPDATE, DELETE and TRUNCATE.
export const auditEvents = pgTable(
  "audit_events",
  {
    id: bigint({ mode: "number" }).primaryKey().generatedAlwaysAsIdentity(),
    at: timestamp({ withTimezone: true }).notNull().defaultNow(),
    actorId: integer().references(() => users.id),
    action: text().notNull(),
    entityType: text().notNull(),
    entityId: text(),
    siteId: integer(),
    before: jsonb(),
    after: jsonb(),
    // Filled by a BEFORE INSERT trigger: position in the hash chain, the previous event's hash and this one's.
    chainSeq: bigint({ mode: "number" }),
    prevHash: text(),
    hash: text(),
  },
  (t) => [
    index("audit_events_at_idx").on(t.at),
    uniqueIndex("audit_events_chain_seq_uq").on(t.chainSeq),
    index("audit_events_entity_idx").on(t.entityType, t.entityId, t.at),
    index("audit_events_actor_idx").on(t.actorId, t.at),
  ],
);

export type InstrumentEvent = typeof instrumentEvents.$inferSelect;
export type AuditEvent = typeof auditEvents.$inferSelect;
export type SeriesSummary = typeof seriesSummaries.$inferSelect;
