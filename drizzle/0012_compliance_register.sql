CREATE TYPE "public"."asset_kind" AS ENUM('circuit', 'site');--> statement-breakpoint
CREATE TABLE "asset_obligations" (
	"asset_id" uuid NOT NULL,
	"obligation_type_id" uuid NOT NULL,
	"last_done_on" date,
	"last_result" text,
	"next_due_on" date,
	CONSTRAINT "asset_obligations_asset_id_obligation_type_id_pk" PRIMARY KEY("asset_id","obligation_type_id")
);
--> statement-breakpoint
CREATE TABLE "assets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"kind" "asset_kind" NOT NULL,
	"site_kind" text,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"route" text DEFAULT '' NOT NULL,
	"owner_standard" text NOT NULL,
	"in_service_on" date,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "assets_project_id_code_unique" UNIQUE("project_id","code")
);
--> statement-breakpoint
CREATE TABLE "digest_sends" (
	"user_id" uuid NOT NULL,
	"week_start_on" date NOT NULL,
	"sent_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "digest_sends_user_id_week_start_on_pk" PRIMARY KEY("user_id","week_start_on")
);
--> statement-breakpoint
CREATE TABLE "obligation_records" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"asset_id" uuid NOT NULL,
	"obligation_type_id" uuid NOT NULL,
	"done_on" date NOT NULL,
	"performed_by" text NOT NULL,
	"values" jsonb NOT NULL,
	"result" text NOT NULL,
	"remarks" text DEFAULT '' NOT NULL,
	"evidence_key" text,
	"evidence_name" text,
	"evidence_type" text,
	"evidence_bytes" integer,
	"evidence_sha256" text,
	"recorded_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "obligation_types" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"owner_standard" text NOT NULL,
	"name" text NOT NULL,
	"applies_to" text NOT NULL,
	"first_due_months" integer NOT NULL,
	"interval_months" integer,
	"criterion" jsonb,
	"remind_days_before" integer DEFAULT 30 NOT NULL,
	"basis" text NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "obligation_types_owner_standard_name_unique" UNIQUE("owner_standard","name")
);
--> statement-breakpoint
CREATE TABLE "register_snapshots" (
	"project_id" uuid NOT NULL,
	"day" date NOT NULL,
	"status" text NOT NULL,
	"count" integer NOT NULL,
	CONSTRAINT "register_snapshots_project_id_day_status_pk" PRIMARY KEY("project_id","day","status")
);
--> statement-breakpoint
CREATE TABLE "reminder_sends" (
	"asset_id" uuid NOT NULL,
	"obligation_type_id" uuid NOT NULL,
	"due_on" date NOT NULL,
	"stage" text NOT NULL,
	"sent_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "reminder_sends_asset_id_obligation_type_id_due_on_stage_pk" PRIMARY KEY("asset_id","obligation_type_id","due_on","stage")
);
--> statement-breakpoint
CREATE TABLE "site_system_data" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"data" jsonb NOT NULL,
	"source" text NOT NULL,
	"source_date" date NOT NULL,
	"published_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "site_system_data_site_id_version_unique" UNIQUE("site_id","version")
);
--> statement-breakpoint
CREATE TABLE "study_assets" (
	"study_id" uuid NOT NULL,
	"asset_id" uuid NOT NULL,
	"study_circuit_id" text,
	"site_end" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "study_assets_study_id_asset_id_pk" PRIMARY KEY("study_id","asset_id")
);
--> statement-breakpoint
CREATE TABLE "study_reviews" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"study_id" uuid NOT NULL,
	"revision_id" uuid NOT NULL,
	"system_data_id" uuid NOT NULL,
	"reasons" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "study_reviews_revision_id_system_data_id_unique" UNIQUE("revision_id","system_data_id")
);
--> statement-breakpoint
ALTER TABLE "asset_obligations" ADD CONSTRAINT "asset_obligations_asset_id_assets_id_fk" FOREIGN KEY ("asset_id") REFERENCES "public"."assets"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "asset_obligations" ADD CONSTRAINT "asset_obligations_obligation_type_id_obligation_types_id_fk" FOREIGN KEY ("obligation_type_id") REFERENCES "public"."obligation_types"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "assets" ADD CONSTRAINT "assets_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "assets" ADD CONSTRAINT "assets_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "digest_sends" ADD CONSTRAINT "digest_sends_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "obligation_records" ADD CONSTRAINT "obligation_records_asset_id_assets_id_fk" FOREIGN KEY ("asset_id") REFERENCES "public"."assets"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "obligation_records" ADD CONSTRAINT "obligation_records_obligation_type_id_obligation_types_id_fk" FOREIGN KEY ("obligation_type_id") REFERENCES "public"."obligation_types"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "obligation_records" ADD CONSTRAINT "obligation_records_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "obligation_types" ADD CONSTRAINT "obligation_types_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "register_snapshots" ADD CONSTRAINT "register_snapshots_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reminder_sends" ADD CONSTRAINT "reminder_sends_asset_id_assets_id_fk" FOREIGN KEY ("asset_id") REFERENCES "public"."assets"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reminder_sends" ADD CONSTRAINT "reminder_sends_obligation_type_id_obligation_types_id_fk" FOREIGN KEY ("obligation_type_id") REFERENCES "public"."obligation_types"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_system_data" ADD CONSTRAINT "site_system_data_site_id_assets_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."assets"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_system_data" ADD CONSTRAINT "site_system_data_published_by_users_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "study_assets" ADD CONSTRAINT "study_assets_study_id_studies_id_fk" FOREIGN KEY ("study_id") REFERENCES "public"."studies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "study_assets" ADD CONSTRAINT "study_assets_asset_id_assets_id_fk" FOREIGN KEY ("asset_id") REFERENCES "public"."assets"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "study_reviews" ADD CONSTRAINT "study_reviews_study_id_studies_id_fk" FOREIGN KEY ("study_id") REFERENCES "public"."studies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "study_reviews" ADD CONSTRAINT "study_reviews_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "study_reviews" ADD CONSTRAINT "study_reviews_system_data_id_site_system_data_id_fk" FOREIGN KEY ("system_data_id") REFERENCES "public"."site_system_data"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "asset_obligations_due_idx" ON "asset_obligations" USING btree ("next_due_on");--> statement-breakpoint
CREATE INDEX "assets_code_idx" ON "assets" USING btree ("code","id");--> statement-breakpoint
CREATE INDEX "obligation_records_asset_idx" ON "obligation_records" USING btree ("asset_id","done_on");--> statement-breakpoint
CREATE INDEX "study_assets_asset_idx" ON "study_assets" USING btree ("asset_id");--> statement-breakpoint
CREATE INDEX "study_reviews_study_idx" ON "study_reviews" USING btree ("study_id");