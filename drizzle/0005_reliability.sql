CREATE TYPE "public"."file_status" AS ENUM('pending', 'stored');--> statement-breakpoint
CREATE TABLE "record_failures" (
	"revision_id" uuid PRIMARY KEY NOT NULL,
	"error" text NOT NULL,
	"failed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "revision_files" ADD COLUMN "status" "file_status" DEFAULT 'stored' NOT NULL;--> statement-breakpoint
ALTER TABLE "record_failures" ADD CONSTRAINT "record_failures_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE no action ON UPDATE no action;