CREATE TYPE "public"."interval_recommendation" AS ENUM('extend', 'keep', 'shorten');--> statement-breakpoint
CREATE TYPE "public"."review_decision" AS ENUM('approved', 'rejected');--> statement-breakpoint
CREATE TABLE "interval_review_decisions" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "interval_review_decisions_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"plan_id" integer NOT NULL,
	"recommendation" interval_recommendation NOT NULL,
	"reason" text NOT NULL,
	"previous_interval_days" integer NOT NULL,
	"proposed_interval_days" integer NOT NULL,
	"decision" "review_decision" NOT NULL,
	"comment" text NOT NULL,
	"decided_by_id" integer NOT NULL,
	"decided_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
DROP INDEX "notifications_episode_idx";--> statement-breakpoint
ALTER TABLE "test_weights" ADD COLUMN "certificate_file_name" text;--> statement-breakpoint
ALTER TABLE "test_weights" ADD COLUMN "certificate_media_type" text;--> statement-breakpoint
ALTER TABLE "test_weights" ADD COLUMN "set_label" text;--> statement-breakpoint
ALTER TABLE "audit_events" ADD COLUMN "chain_seq" bigint;--> statement-breakpoint
ALTER TABLE "audit_events" ADD COLUMN "prev_hash" text;--> statement-breakpoint
ALTER TABLE "audit_events" ADD COLUMN "hash" text;--> statement-breakpoint
ALTER TABLE "training_records" ADD COLUMN "recorded_by_id" integer;--> statement-breakpoint
ALTER TABLE "interval_review_decisions" ADD CONSTRAINT "interval_review_decisions_plan_id_check_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."check_plans"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "interval_review_decisions" ADD CONSTRAINT "interval_review_decisions_decided_by_id_users_id_fk" FOREIGN KEY ("decided_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "interval_review_decisions_plan_idx" ON "interval_review_decisions" USING btree ("plan_id","decided_at");--> statement-breakpoint
ALTER TABLE "training_records" ADD CONSTRAINT "training_records_recorded_by_id_users_id_fk" FOREIGN KEY ("recorded_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "audit_events_chain_seq_uq" ON "audit_events" USING btree ("chain_seq");--> statement-breakpoint
CREATE UNIQUE INDEX "notifications_user_episode_uq" ON "notifications" USING btree ("user_id","episode_key");