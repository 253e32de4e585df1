CREATE INDEX "audit_events_revision_idx" ON "audit_events" USING btree ("revision_id","id");--> statement-breakpoint
CREATE INDEX "audit_events_project_idx" ON "audit_events" USING btree ("project_id","id");--> statement-breakpoint
CREATE INDEX "audit_events_shared_type_idx" ON "audit_events" USING btree ("type" text_pattern_ops) WHERE "audit_events"."project_id" is null;