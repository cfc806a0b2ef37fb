-- Lintel's own words for the corrective-action workflow and the verdicts (see
-- shared/workflow/action-workflow.ts and shared/calc/verdict.ts). Stored values are renamed in
-- place, so every row keeps its meaning. The change log is append-only and is not rewritten: its
-- older entries keep the earlier codes, which are translated when read.
ALTER TYPE "public"."action_status" RENAME TO "action_state";--> statement-breakpoint
ALTER TYPE "public"."action_state" RENAME VALUE 'open' TO 'to_fix';--> statement-breakpoint
ALTER TYPE "public"."action_state" RENAME VALUE 'in_progress' TO 'fixing';--> statement-breakpoint
ALTER TYPE "public"."action_state" RENAME VALUE 'awaiting_verification' TO 'to_check';--> statement-breakpoint
ALTER TYPE "public"."action_state" RENAME VALUE 'closed' TO 'done';--> statement-breakpoint
ALTER TYPE "public"."action_close_reason" RENAME VALUE 'verified' TO 'confirmed';--> statement-breakpoint
ALTER TABLE "corrective_actions" RENAME COLUMN "status" TO "state";--> statement-breakpoint
ALTER TABLE "corrective_actions" ALTER COLUMN "state" SET DEFAULT 'to_fix';--> statement-breakpoint
ALTER INDEX "corrective_actions_one_unclosed" RENAME TO "corrective_actions_one_unfinished";--> statement-breakpoint
ALTER TYPE "public"."verdict" RENAME VALUE 'not_ready' TO 'hold';--> statement-breakpoint
ALTER TYPE "public"."verdict" RENAME VALUE 'ready_with_conditions' TO 'gaps_to_fix';--> statement-breakpoint
ALTER TYPE "public"."verdict" RENAME VALUE 'ready' TO 'all_clear';--> statement-breakpoint
ALTER TABLE "audit_month_stats" RENAME COLUMN "ready" TO "all_clear";--> statement-breakpoint
ALTER TABLE "audit_month_stats" RENAME COLUMN "with_conditions" TO "gaps_to_fix";--> statement-breakpoint
ALTER TABLE "audit_month_stats" RENAME COLUMN "not_ready" TO "hold";--> statement-breakpoint
-- Mail not yet sent (or kept for the undelivered list) is about the same things under new names.
UPDATE "outbox" SET "topic" = 'action_to_check' WHERE "topic" = 'action_awaiting_verification';--> statement-breakpoint
UPDATE "outbox" SET "topic" = 'action_sent_back' WHERE "topic" = 'action_rejected';
