ALTER TABLE "checks" ADD COLUMN "dedupe_key" text;--> statement-breakpoint
CREATE UNIQUE INDEX "checks_dedupe_uq" ON "checks" USING btree ("dedupe_key");