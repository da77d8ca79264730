ALTER TABLE "flag_verdicts" ADD COLUMN "reason" text;--> statement-breakpoint
ALTER TABLE "flag_verdicts" ADD COLUMN "answer" text;--> statement-breakpoint
ALTER TABLE "flag_verdicts" ADD COLUMN "answered_by" text;--> statement-breakpoint
ALTER TABLE "flag_verdicts" ADD COLUMN "answered_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "flag_verdicts" ADD CONSTRAINT "flag_verdicts_answered_by_user_id_fk" FOREIGN KEY ("answered_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "flag_verdicts" ADD CONSTRAINT "flag_verdicts_reason_len" CHECK ("flag_verdicts"."reason" is null or char_length("flag_verdicts"."reason") <= 2000);--> statement-breakpoint
ALTER TABLE "flag_verdicts" ADD CONSTRAINT "flag_verdicts_answer_len" CHECK ("flag_verdicts"."answer" is null or char_length("flag_verdicts"."answer") <= 20000);