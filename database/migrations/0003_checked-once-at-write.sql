CREATE TABLE "run_checks" (
	"run_version_id" uuid PRIMARY KEY NOT NULL,
	"inputs_key" text NOT NULL,
	"derived" jsonb NOT NULL,
	"e" double precision,
	"ra" double precision,
	"ra_rotating" double precision,
	"pr" double precision,
	"pm" double precision,
	"rm" double precision,
	"run_length_magnetic" double precision,
	"checked_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "rounds" ADD COLUMN "change_seq" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "rounds" ADD COLUMN "checked_seq" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "attachments" ADD COLUMN "analysis" jsonb;--> statement-breakpoint
ALTER TABLE "attachments" ADD COLUMN "plot" jsonb;--> statement-breakpoint
ALTER TABLE "round_runs" ADD COLUMN "checked_key" text;--> statement-breakpoint
ALTER TABLE "claims" ADD COLUMN "checked_key" text;--> statement-breakpoint
ALTER TABLE "flags" ADD COLUMN "run_version_id" uuid;--> statement-breakpoint
ALTER TABLE "run_checks" ADD CONSTRAINT "run_checks_run_version_id_run_versions_id_fk" FOREIGN KEY ("run_version_id") REFERENCES "public"."run_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flags" ADD CONSTRAINT "flags_run_version_id_run_versions_id_fk" FOREIGN KEY ("run_version_id") REFERENCES "public"."run_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
-- Rounds stored before this change get their files analysed and their checks stored by the check job.
UPDATE "rounds" SET "change_seq" = 1 WHERE EXISTS (SELECT 1 FROM "round_runs" WHERE "round_runs"."round_id" = "rounds"."id");
