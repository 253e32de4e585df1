CREATE TABLE "asset_summaries" (
	"asset_id" uuid PRIMARY KEY NOT NULL,
	"project_id" uuid NOT NULL,
	"kind" "asset_kind" NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"issued" text DEFAULT '' NOT NULL,
	"issued_count" integer DEFAULT 0 NOT NULL,
	"worst_margin_pct" double precision,
	"open_remarks" integer DEFAULT 0 NOT NULL,
	"open_reviews" integer DEFAULT 0 NOT NULL,
	"obligations_done" integer DEFAULT 0 NOT NULL,
	"due_dates" date[] DEFAULT '{}'::date[] NOT NULL,
	"next_due_on" date,
	"standing" smallint NOT NULL
);
--> statement-breakpoint
ALTER TABLE "assets" DROP CONSTRAINT "assets_project_id_code_unique";--> statement-breakpoint
ALTER TABLE "assets" ADD COLUMN "removed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "assets" ADD COLUMN "removed_by" uuid;--> statement-breakpoint
ALTER TABLE "asset_summaries" ADD CONSTRAINT "asset_summaries_asset_id_assets_id_fk" FOREIGN KEY ("asset_id") REFERENCES "public"."assets"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "asset_summaries" ADD CONSTRAINT "asset_summaries_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "asset_summaries_code_idx" ON "asset_summaries" USING btree ("project_id","code","asset_id");--> statement-breakpoint
CREATE INDEX "asset_summaries_name_idx" ON "asset_summaries" USING btree ("project_id","name","asset_id");--> statement-breakpoint
CREATE INDEX "asset_summaries_due_idx" ON "asset_summaries" USING btree ("project_id",coalesce("next_due_on", '9999-12-31'::date),"asset_id");--> statement-breakpoint
CREATE INDEX "asset_summaries_margin_idx" ON "asset_summaries" USING btree ("project_id",coalesce("worst_margin_pct", 1e9::float8),"asset_id");--> statement-breakpoint
CREATE INDEX "asset_summaries_standing_idx" ON "asset_summaries" USING btree ("project_id","standing",coalesce("next_due_on", '9999-12-31'::date),"asset_id");--> statement-breakpoint
ALTER TABLE "assets" ADD CONSTRAINT "assets_removed_by_users_id_fk" FOREIGN KEY ("removed_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "assets_project_code_live_idx" ON "assets" USING btree ("project_id","code") WHERE "assets"."removed_at" is null;