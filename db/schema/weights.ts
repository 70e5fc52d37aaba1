import { date, index, integer, numeric, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { sites } from "./sites";

export const testWeights = pgTable(
  "test_weights",
  {
    id: integer().primaryKey().generatedAlwaysAsIdentity(),
    siteId: integer().notNull().references(() => sites.id),
    identifier: text().notNull().unique(),
    nominalG: numeric().notNull(),
    // OIML R 111 E1…M3 or ASTM E617 classes, as printed on the certificate.
    weightClass: text().notNull(),
    conventionalMassG: numeric().notNull(),
    expandedUncertaintyG: numeric().notNull(),
    certificateNumber: text().notNull(),
    calibratedOn: date().notNull(),
    dueOn: date().notNull(),
    // Storage key of the certificate file (see app/lib/storage.server.ts), its original name and media type.
    certificateFile: text(),
    certificateFileName: text(),
    certificateMediaType: text(),
    // Pieces of one set share a label; a single weight has none.
    setLabel: text(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("test_weights_site_due_idx").on(t.siteId, t.dueOn)],
);

export type TestWeight = typeof testWeights.$inferSelect;
