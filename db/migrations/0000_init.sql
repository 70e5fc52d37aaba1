CREATE TYPE "public"."accuracy_class" AS ENUM('I', 'II', 'III', 'IIII');--> statement-breakpoint
CREATE TYPE "public"."check_source" AS ENUM('form', 'api', 'import');--> statement-breakpoint
CREATE TYPE "public"."check_type" AS ENUM('sensitivity', 'repeatability', 'eccentricity');--> statement-breakpoint
CREATE TYPE "public"."eccentricity_position" AS ENUM('centre', 'front-left', 'back-left', 'back-right', 'front-right');--> statement-breakpoint
CREATE TYPE "public"."event_kind" AS ENUM('calibration', 'adjustment', 'repair', 'relocation', 'note');--> statement-breakpoint
CREATE TYPE "public"."guard_band_policy" AS ENUM('fraction_of_tolerance', 'expanded_uncertainty', 'none');--> statement-breakpoint
CREATE TYPE "public"."import_status" AS ENUM('uploading', 'validating', 'rejected', 'importing', 'done', 'failed');--> statement-breakpoint
CREATE TYPE "public"."instrument_kind" AS ENUM('micro_balance', 'semi_micro_balance', 'analytical_balance', 'precision_balance', 'bench_scale', 'floor_scale');--> statement-breakpoint
CREATE TYPE "public"."instrument_status" AS ENUM('in_service', 'out_of_service', 'retired');--> statement-breakpoint
CREATE TYPE "public"."mass_unit" AS ENUM('mg', 'g', 'kg');--> statement-breakpoint
CREATE TYPE "public"."outcome" AS ENUM('in_tolerance', 'guard_band', 'out_of_tolerance');--> statement-breakpoint
CREATE TYPE "public"."risk_level" AS ENUM('low', 'medium', 'high');--> statement-breakpoint
CREATE TYPE "public"."role" AS ENUM('admin', 'metrologist', 'site_manager', 'technician', 'analyst');--> statement-breakpoint
CREATE TYPE "public"."tolerance_basis" AS ENUM('absolute', 'percent_of_load', 'usp41', 'oiml_r76_in_service');--> statement-breakpoint
CREATE TABLE "rooms" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "rooms_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"site_id" integer NOT NULL,
	"name" text NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sites" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "sites_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"code" text NOT NULL,
	"name" text NOT NULL,
	"time_zone" text NOT NULL,
	CONSTRAINT "sites_code_unique" UNIQUE("code")
);
--> statement-breakpoint
CREATE TABLE "api_tokens" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "api_tokens_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"user_id" integer NOT NULL,
	"name" text NOT NULL,
	"token_hash" text NOT NULL,
	"prefix" text NOT NULL,
	"created_by_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_used_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	CONSTRAINT "api_tokens_tokenHash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "memberships" (
	"user_id" integer NOT NULL,
	"site_id" integer NOT NULL,
	"role" "role" NOT NULL,
	CONSTRAINT "memberships_user_id_site_id_pk" PRIMARY KEY("user_id","site_id")
);
--> statement-breakpoint
CREATE TABLE "users" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "users_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"email" text NOT NULL,
	"name" text NOT NULL,
	"subject" text,
	"active" boolean DEFAULT true NOT NULL,
	"digests_enabled" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "users_email_unique" UNIQUE("email"),
	CONSTRAINT "users_subject_unique" UNIQUE("subject")
);
--> statement-breakpoint
CREATE TABLE "instruments" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "instruments_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"site_id" integer NOT NULL,
	"room_id" integer,
	"asset_tag" text NOT NULL,
	"kind" "instrument_kind" NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"serial_number" text DEFAULT '' NOT NULL,
	"capacity_g" numeric NOT NULL,
	"readability_g" numeric NOT NULL,
	"verification_interval_g" numeric NOT NULL,
	"display_unit" "mass_unit" DEFAULT 'g' NOT NULL,
	"accuracy_class" "accuracy_class",
	"smallest_net_weight_g" numeric,
	"process_tolerance_percent" numeric,
	"risk_level" "risk_level" DEFAULT 'medium' NOT NULL,
	"status" "instrument_status" DEFAULT 'in_service' NOT NULL,
	"owner_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "instruments_assetTag_unique" UNIQUE("asset_tag")
);
--> statement-breakpoint
CREATE TABLE "test_weights" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "test_weights_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"site_id" integer NOT NULL,
	"identifier" text NOT NULL,
	"nominal_g" numeric NOT NULL,
	"weight_class" text NOT NULL,
	"conventional_mass_g" numeric NOT NULL,
	"expanded_uncertainty_g" numeric NOT NULL,
	"certificate_number" text NOT NULL,
	"calibrated_on" date NOT NULL,
	"due_on" date NOT NULL,
	"certificate_file" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "test_weights_identifier_unique" UNIQUE("identifier")
);
--> statement-breakpoint
CREATE TABLE "check_plan_weights" (
	"plan_id" integer NOT NULL,
	"weight_id" integer NOT NULL,
	CONSTRAINT "check_plan_weights_plan_id_weight_id_pk" PRIMARY KEY("plan_id","weight_id")
);
--> statement-breakpoint
CREATE TABLE "check_plans" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "check_plans_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"instrument_id" integer NOT NULL,
	"check_type" "check_type" NOT NULL,
	"interval_days" integer NOT NULL,
	"tolerance_basis" "tolerance_basis" NOT NULL,
	"tolerance_value" numeric,
	"guard_band_policy" "guard_band_policy" DEFAULT 'fraction_of_tolerance' NOT NULL,
	"guard_band_fraction" numeric DEFAULT '0.3333333333' NOT NULL,
	"load_g" numeric,
	"repetitions" integer,
	"safety_factor" numeric DEFAULT '2' NOT NULL,
	"risk_assessment" jsonb,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "check_readings" (
	"check_id" bigint NOT NULL,
	"ordinal" integer NOT NULL,
	"position" "eccentricity_position",
	"value" numeric NOT NULL,
	CONSTRAINT "check_readings_check_id_ordinal_pk" PRIMARY KEY("check_id","ordinal")
);
--> statement-breakpoint
CREATE TABLE "checks" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "checks_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
	"instrument_id" integer NOT NULL,
	"check_type" "check_type" NOT NULL,
	"plan_id" integer,
	"weight_id" integer,
	"operator_id" integer NOT NULL,
	"performed_at" timestamp with time zone NOT NULL,
	"recorded_at" timestamp with time zone DEFAULT now() NOT NULL,
	"unit" "mass_unit" NOT NULL,
	"result_g" double precision NOT NULL,
	"expanded_uncertainty_g" double precision,
	"tolerance_g" double precision,
	"acceptance_g" double precision,
	"outcome" "outcome" NOT NULL,
	"source" "check_source" NOT NULL,
	"idempotency_key" text,
	"request_hash" text,
	"import_id" integer,
	"note" text DEFAULT '' NOT NULL,
	"corrects_check_id" bigint,
	"correction_reason" text,
	"superseded_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "audit_events" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "audit_events_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"actor_id" integer,
	"action" text NOT NULL,
	"entity_type" text NOT NULL,
	"entity_id" text,
	"site_id" integer,
	"before" jsonb,
	"after" jsonb
);
--> statement-breakpoint
CREATE TABLE "import_rows_rejected" (
	"import_id" integer NOT NULL,
	"line" integer NOT NULL,
	"column" text,
	"reason" text NOT NULL,
	"raw" text
);
--> statement-breakpoint
CREATE TABLE "imports" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "imports_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"created_by_id" integer NOT NULL,
	"filename" text NOT NULL,
	"status" text NOT NULL,
	"mapping" jsonb,
	"total_rows" integer DEFAULT 0 NOT NULL,
	"valid_rows" integer DEFAULT 0 NOT NULL,
	"rejected_rows" integer DEFAULT 0 NOT NULL,
	"duplicate_rows" integer DEFAULT 0 NOT NULL,
	"bytes_total" bigint,
	"bytes_read" bigint DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "events" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "events_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"instrument_id" integer NOT NULL,
	"kind" "event_kind" NOT NULL,
	"occurred_at" timestamp with time zone NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"created_by_id" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "notifications" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "notifications_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"user_id" integer NOT NULL,
	"kind" text NOT NULL,
	"subject" text NOT NULL,
	"body" text NOT NULL,
	"instrument_id" integer,
	"episode_key" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone,
	"read_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "point_annotations" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "point_annotations_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"check_id" bigint NOT NULL,
	"excluded" boolean NOT NULL,
	"reason" text NOT NULL,
	"created_by_id" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"withdrawn_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "series_summaries" (
	"instrument_id" integer NOT NULL,
	"check_type" "check_type" NOT NULL,
	"computed_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_check_at" timestamp with time zone,
	"next_due_at" timestamp with time zone,
	"point_count" integer DEFAULT 0 NOT NULL,
	"center" double precision,
	"sigma" double precision,
	"active_signals" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"trend" jsonb,
	"forecast" jsonb,
	"review" jsonb,
	CONSTRAINT "series_summaries_instrument_id_check_type_pk" PRIMARY KEY("instrument_id","check_type")
);
--> statement-breakpoint
CREATE TABLE "training_records" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "training_records_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"user_id" integer NOT NULL,
	"procedure" text NOT NULL,
	"trained_on" date NOT NULL,
	"trainer_name" text NOT NULL,
	"expires_on" date,
	"evidence" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "rooms" ADD CONSTRAINT "rooms_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "api_tokens" ADD CONSTRAINT "api_tokens_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "api_tokens" ADD CONSTRAINT "api_tokens_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "memberships" ADD CONSTRAINT "memberships_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "memberships" ADD CONSTRAINT "memberships_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "instruments" ADD CONSTRAINT "instruments_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "instruments" ADD CONSTRAINT "instruments_room_id_rooms_id_fk" FOREIGN KEY ("room_id") REFERENCES "public"."rooms"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "instruments" ADD CONSTRAINT "instruments_owner_id_users_id_fk" FOREIGN KEY ("owner_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "test_weights" ADD CONSTRAINT "test_weights_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "check_plan_weights" ADD CONSTRAINT "check_plan_weights_plan_id_check_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."check_plans"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "check_plan_weights" ADD CONSTRAINT "check_plan_weights_weight_id_test_weights_id_fk" FOREIGN KEY ("weight_id") REFERENCES "public"."test_weights"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "check_plans" ADD CONSTRAINT "check_plans_instrument_id_instruments_id_fk" FOREIGN KEY ("instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "check_readings" ADD CONSTRAINT "check_readings_check_id_checks_id_fk" FOREIGN KEY ("check_id") REFERENCES "public"."checks"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checks" ADD CONSTRAINT "checks_instrument_id_instruments_id_fk" FOREIGN KEY ("instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checks" ADD CONSTRAINT "checks_plan_id_check_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."check_plans"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checks" ADD CONSTRAINT "checks_weight_id_test_weights_id_fk" FOREIGN KEY ("weight_id") REFERENCES "public"."test_weights"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checks" ADD CONSTRAINT "checks_operator_id_users_id_fk" FOREIGN KEY ("operator_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_events" ADD CONSTRAINT "audit_events_actor_id_users_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_rows_rejected" ADD CONSTRAINT "import_rows_rejected_import_id_imports_id_fk" FOREIGN KEY ("import_id") REFERENCES "public"."imports"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "imports" ADD CONSTRAINT "imports_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "events" ADD CONSTRAINT "events_instrument_id_instruments_id_fk" FOREIGN KEY ("instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "events" ADD CONSTRAINT "events_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notifications" ADD CONSTRAINT "notifications_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notifications" ADD CONSTRAINT "notifications_instrument_id_instruments_id_fk" FOREIGN KEY ("instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "point_annotations" ADD CONSTRAINT "point_annotations_check_id_checks_id_fk" FOREIGN KEY ("check_id") REFERENCES "public"."checks"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "point_annotations" ADD CONSTRAINT "point_annotations_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "series_summaries" ADD CONSTRAINT "series_summaries_instrument_id_instruments_id_fk" FOREIGN KEY ("instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "training_records" ADD CONSTRAINT "training_records_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "rooms_site_name_uq" ON "rooms" USING btree ("site_id","name");--> statement-breakpoint
CREATE INDEX "api_tokens_user_idx" ON "api_tokens" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "memberships_site_idx" ON "memberships" USING btree ("site_id","role");--> statement-breakpoint
CREATE INDEX "instruments_site_status_idx" ON "instruments" USING btree ("site_id","status");--> statement-breakpoint
CREATE INDEX "instruments_room_idx" ON "instruments" USING btree ("room_id");--> statement-breakpoint
CREATE INDEX "instruments_search_idx" ON "instruments" USING btree (lower("asset_tag"));--> statement-breakpoint
CREATE INDEX "test_weights_site_due_idx" ON "test_weights" USING btree ("site_id","due_on");--> statement-breakpoint
CREATE UNIQUE INDEX "check_plans_instrument_type_uq" ON "check_plans" USING btree ("instrument_id","check_type");--> statement-breakpoint
CREATE INDEX "checks_series_idx" ON "checks" USING btree ("instrument_id","check_type","performed_at");--> statement-breakpoint
CREATE INDEX "checks_performed_idx" ON "checks" USING btree ("performed_at");--> statement-breakpoint
CREATE UNIQUE INDEX "checks_idempotency_uq" ON "checks" USING btree ("operator_id","idempotency_key");--> statement-breakpoint
CREATE INDEX "audit_events_at_idx" ON "audit_events" USING btree ("at");--> statement-breakpoint
CREATE INDEX "audit_events_entity_idx" ON "audit_events" USING btree ("entity_type","entity_id","at");--> statement-breakpoint
CREATE INDEX "audit_events_actor_idx" ON "audit_events" USING btree ("actor_id","at");--> statement-breakpoint
CREATE INDEX "import_rows_rejected_import_idx" ON "import_rows_rejected" USING btree ("import_id","line");--> statement-breakpoint
CREATE INDEX "events_instrument_idx" ON "events" USING btree ("instrument_id","occurred_at");--> statement-breakpoint
CREATE INDEX "notifications_user_idx" ON "notifications" USING btree ("user_id","created_at");--> statement-breakpoint
CREATE INDEX "notifications_episode_idx" ON "notifications" USING btree ("user_id","episode_key");--> statement-breakpoint
CREATE INDEX "point_annotations_check_idx" ON "point_annotations" USING btree ("check_id");--> statement-breakpoint
CREATE INDEX "series_summaries_due_idx" ON "series_summaries" USING btree ("next_due_at");--> statement-breakpoint
CREATE INDEX "training_records_user_idx" ON "training_records" USING btree ("user_id","procedure");--> statement-breakpoint
CREATE INDEX "training_records_expiry_idx" ON "training_records" USING btree ("expires_on");