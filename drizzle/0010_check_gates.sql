ALTER TABLE "check_values" ADD COLUMN "updated_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "checklist_items" ADD COLUMN "answer_generated" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "checklist_items" ADD COLUMN "designer_justification" text;--> statement-breakpoint
ALTER TABLE "checklist_items" ADD COLUMN "designer_justified_by" uuid;--> statement-breakpoint
ALTER TABLE "remarks" ADD COLUMN "kind" text DEFAULT 'remark' NOT NULL;--> statement-breakpoint
ALTER TABLE "remarks" ADD COLUMN "closed_by" uuid;--> statement-breakpoint
ALTER TABLE "remarks" ADD COLUMN "closed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "sign_offs" ADD COLUMN "inputs_hash" text;--> statement-breakpoint
ALTER TABLE "sign_offs" ADD COLUMN "results_hash" text;--> statement-breakpoint
ALTER TABLE "checklist_items" ADD CONSTRAINT "checklist_items_designer_justified_by_users_id_fk" FOREIGN KEY ("designer_justified_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "remarks" ADD CONSTRAINT "remarks_closed_by_users_id_fk" FOREIGN KEY ("closed_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;