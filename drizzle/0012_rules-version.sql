ALTER TABLE "audit_answers" ADD COLUMN "entered_value" double precision;--> statement-breakpoint
ALTER TABLE "audits" ADD COLUMN "rules_version" integer;--> statement-breakpoint
ALTER TABLE "audits" ADD COLUMN "verdict_reasons" jsonb;--> statement-breakpoint
-- Verdicts stored before this migration were decided by version 1 of the readiness rules.
UPDATE "audits" SET "rules_version" = 1 WHERE "verdict" IS NOT NULL;--> statement-breakpoint
-- Readings stored before this migration kept only the SI value: work the entered one back out.
UPDATE "audit_answers" SET "entered_value" = CASE "unit"
  WHEN 'inH2O' THEN "value" / (0.0254 * 9.80665 * 1000)
  WHEN 'cfm' THEN "value" / (0.3048 ^ 3 * 60)
  ELSE "value" END
WHERE "value" IS NOT NULL;
