CREATE TABLE "series_file_maps" (
	"submission_id" uuid PRIMARY KEY NOT NULL,
	"maps" jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "attachments" ADD COLUMN "format" text DEFAULT 'csv' NOT NULL;--> statement-breakpoint
ALTER TABLE "attachments" ADD COLUMN "source_map" text;--> statement-breakpoint
ALTER TABLE "series_file_maps" ADD CONSTRAINT "series_file_maps_submission_id_submissions_id_fk" FOREIGN KEY ("submission_id") REFERENCES "public"."submissions"("id") ON DELETE cascade ON UPDATE no action;