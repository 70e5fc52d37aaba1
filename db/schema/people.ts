import { boolean, index, integer, pgTable, primaryKey, text, timestamp } from "drizzle-orm/pg-core";
import { roleEnum } from "./enums";
import { sites } from "./sites";

export const users = pgTable("users", {
  id: integer().primaryKey().generatedAlwaysAsIdentity(),
  email: text().notNull().unique(),
  name: text().notNull(),
  // The identity provider's subject; bound on first sign-in of a registered e-mail.
  subject: text().unique(),
  active: boolean().notNull().default(true),
  digestsEnabled: boolean().notNull().default(true),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

export const memberships = pgTable(
  "memberships",
  {
    userId: integer().notNull().references(() => users.id),
    siteId: integer().notNull().references(() => sites.id),
    role: roleEnum().notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.siteId] }), index("memberships_site_idx").on(t.siteId, t.role)],
);

export const apiTokens = pgTable(
  "api_tokens",
  {
    id: integer().primaryKey().generatedAlwaysAsIdentity(),
    userId: integer().notNull().references(() => users.id),
    name: text().notNull(),
    // SHA-256 of the secret; the secret itself is shown once and never stored.
    tokenHash: text().notNull().unique(),
    prefix: text().notNull(),
    createdById: integer().references(() => users.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    lastUsedAt: timestamp({ withTimezone: true }),
    revokedAt: timestamp({ withTimezone: true }),
  },
  (t) => [index("api_tokens_user_idx").on(t.userId)],
);

export type User = typeof users.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type ApiToken = typeof apiTokens.$inferSelect;
