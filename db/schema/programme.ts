import { index, integer, pgEnum, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { checkPlans } from "./checks";
import { users } from "./people";

export const reviewDecisionEnum = pgEnum("review_decision", ["approved", "rejected"]);
export const intervalRecommendationEnum = pgEnum("interval_recommendation", ["extend", "keep", "shorten"]);

// A metrologist's answer to the engine's interval review of one plan: what was recommended, why, and what was decided.
export const intervalReviewDecisions = pgTable(
  "interval_review_decisions",
  {
    id: integer().primaryKey().generatedAlwaysAsIdentity(),
    planId: integer().notNull().references(() => checkPlans.id),
    recommendation: intervalRecommendationEnum().notNull(),
    reason: text().notNull(),
    previousIntervalDays: integer().notNull(),
    proposedIntervalDays: integer().notNull(),
    decision: reviewDecisionEnum().notNull(),
    comment: text().notNull(),
    decidedById: integer().notNull().references(() => users.id),
    decidedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("interval_review_decisions_plan_idx").on(t.planId, t.decidedAt)],
);

export type IntervalReviewDecision = typeof intervalReviewDecisions.$inferSelect;
