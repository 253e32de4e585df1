CREATE TABLE "record_settings" (
	"id" text PRIMARY KEY DEFAULT 'records' NOT NULL,
	"append_validation" boolean DEFAULT false NOT NULL,
	"updated_by" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "record_settings_one_row" CHECK ("record_settings"."id" = 'records')
);
--> statement-breakpoint
ALTER TABLE "record_settings" ADD CONSTRAINT "record_settings_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;