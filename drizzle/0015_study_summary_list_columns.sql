ALTER TABLE "study_summaries" ADD COLUMN "code" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "study_summaries" ADD COLUMN "title" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "study_summaries" ADD COLUMN "kind" "study_kind" DEFAULT 'bonding' NOT NULL;--> statement-breakpoint
CREATE INDEX "study_summaries_project_code_idx" ON "study_summaries" USING btree ("project_id","code","study_id");--> statement-breakpoint
CREATE INDEX "study_summaries_project_title_idx" ON "study_summaries" USING btree ("project_id","title","study_id");