ALTER TABLE "rounds" ADD COLUMN "sent_title" text;--> statement-breakpoint
ALTER TABLE "rounds" ADD COLUMN "sent_abstract" text;--> statement-breakpoint
ALTER TABLE "rounds" ADD COLUMN "sent_keywords" text[];--> statement-breakpoint
ALTER TABLE "rounds" ADD COLUMN "sent_manuscript_file_id" uuid;--> statement-breakpoint
ALTER TABLE "rounds" ADD COLUMN "sent_contributors" jsonb;--> statement-breakpoint
-- Rounds sent before this migration keep what the submission holds now as their sent version.
UPDATE "rounds" r SET "sent_title" = s."title", "sent_abstract" = s."abstract", "sent_keywords" = s."keywords", "sent_manuscript_file_id" = s."manuscript_file_id",
  "sent_contributors" = COALESCE((SELECT jsonb_agg(jsonb_build_object('position', c."position", 'name', c."name", 'affiliation', c."affiliation", 'orcid', c."orcid", 'creditRoles', to_jsonb(c."credit_roles"), 'corresponding', c."corresponding") ORDER BY c."position") FROM "contributors" c WHERE c."submission_id" = s."id"), '[]'::jsonb)
  FROM "submissions" s WHERE s."id" = r."submission_id" AND r."state" <> 'draft';
