CREATE TABLE "impact_reviews" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "impact_reviews_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"instrument_id" integer NOT NULL,
	"failed_check_id" bigint NOT NULL,
	"check_type" "check_type" NOT NULL,
	"last_passing_at" timestamp with time zone,
	"checks_since" integer NOT NULL,
	"days_of_use" integer NOT NULL,
	"opened_at" timestamp with time zone DEFAULT now() NOT NULL,
	"closed_at" timestamp with time zone,
	"closed_by_id" integer,
	"conclusion" text
);
--> statement-breakpoint
CREATE TABLE "import_mappings" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "import_mappings_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"name" text NOT NULL,
	"mapping" jsonb NOT NULL,
	"created_by_id" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "import_mappings_name_unique" UNIQUE("name")
);
--> statement-breakpoint
ALTER TABLE "checks" ADD COLUMN "basis" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "checks" ADD COLUMN "details" jsonb;--> statement-breakpoint
ALTER TABLE "impact_reviews" ADD CONSTRAINT "impact_reviews_instrument_id_instruments_id_fk" FOREIGN KEY ("instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "impact_reviews" ADD CONSTRAINT "impact_reviews_failed_check_id_checks_id_fk" FOREIGN KEY ("failed_check_id") REFERENCES "public"."checks"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "impact_reviews" ADD CONSTRAINT "impact_reviews_closed_by_id_users_id_fk" FOREIGN KEY ("closed_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_mappings" ADD CONSTRAINT "import_mappings_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "impact_reviews_instrument_idx" ON "impact_reviews" USING btree ("instrument_id","opened_at");