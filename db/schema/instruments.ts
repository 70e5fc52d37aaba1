import { sql } from "drizzle-orm";
import { index, integer, numeric, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { accuracyClassEnum, instrumentKindEnum, instrumentStatusEnum, massUnitEnum, riskLevelEnum } from "./enums";
import { users } from "./people";
import { rooms, sites } from "./sites";

// Masses are numeric grams: a value typed in mg or kg shifts the decimal point only, so it stays exact.
export const instruments = pgTable(
  "instruments",
  {
    id: integer().primaryKey().generatedAlwaysAsIdentity(),
    siteId: integer().notNull().references(() => sites.id),
    roomId: integer().references(() => rooms.id),
    assetTag: text().notNull().unique(),
    kind: instrumentKindEnum().notNull(),
    description: text().notNull().default(""),
    serialNumber: text().notNull().default(""),
    capacityG: numeric().notNull(),
    readabilityG: numeric().notNull(),
    verificationIntervalG: numeric().notNull(),
    displayUnit: massUnitEnum().notNull().default("g"),
    // null: not a legal-metrology instrument (no OIML R 76 class claimed).
    accuracyClass: accuracyClassEnum(),
    smallestNetWeightG: numeric(),
    processTolerancePercent: numeric(),
    riskLevel: riskLevelEnum().notNull().default("medium"),
    status: instrumentStatusEnum().notNull().default("in_service"),
    ownerId: integer().references(() => users.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("instruments_site_status_idx").on(t.siteId, t.status),
    index("instruments_room_idx").on(t.roomId),
    index("instruments_search_idx").using("btree", sql`lower(${t.assetTag})`),
  ],
);

export type Instrument = typeof instruments.$inferSelect;
export type NewInstrument = typeof instruments.$inferInsert;
