import { integer, pgTable, text, uniqueIndex } from "drizzle-orm/pg-core";

export const sites = pgTable("sites", {
  id: integer().primaryKey().generatedAlwaysAsIdentity(),
  code: text().notNull().unique(),
  name: text().notNull(),
  // IANA zone: every axis and site-local time column is drawn in it.
  timeZone: text().notNull(),
});

export const rooms = pgTable(
  "rooms",
  {
    id: integer().primaryKey().generatedAlwaysAsIdentity(),
    siteId: integer().notNull().references(() => sites.id),
    name: text().notNull(),
  },
  (t) => [uniqueIndex("rooms_site_name_uq").on(t.siteId, t.name)],
);

export type Site = typeof sites.$inferSelect;
export type Room = typeof rooms.$inferSelect;
