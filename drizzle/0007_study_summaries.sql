CREATE TABLE "study_summaries" (
	"study_id" uuid PRIMARY KEY NOT NULL,
	"project_id" uuid NOT NULL,
	"revision_id" uuid NOT NULL,
	"revision_number" integer NOT NULL,
	"state" "revision_state" NOT NULL,
	"updated_at" timestamp with time zone NOT NULL,
	"worst_margin_pct" real,
	"open_remarks" integer DEFAULT 0 NOT NULL
);
--> statement-breakpoint
ALTER TABLE "study_summaries" ADD CONSTRAINT "study_summaries_study_id_studies_id_fk" FOREIGN KEY ("study_id") REFERENCES "public"."studies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "study_summaries" ADD CONSTRAINT "study_summaries_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "study_summaries" ADD CONSTRAINT "study_summaries_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "study_summaries_project_updated_idx" ON "study_summaries" USING btree ("project_id","updated_at","study_id");--> statement-breakpoint
CREATE INDEX "study_summaries_project_state_idx" ON "study_summaries" USING btree ("project_id","state");