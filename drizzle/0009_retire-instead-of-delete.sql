CREATE TYPE "public"."action_close_reason" AS ENUM('verified', 'space_retired');--> statement-breakpoint
ALTER TABLE "audits" DROP CONSTRAINT "audits_site_id_sites_id_fk";
--> statement-breakpoint
ALTER TABLE "audits" DROP CONSTRAINT "audits_space_id_spaces_id_fk";
--> statement-breakpoint
ALTER TABLE "corrective_actions" DROP CONSTRAINT "corrective_actions_site_id_sites_id_fk";
--> statement-breakpoint
ALTER TABLE "corrective_actions" DROP CONSTRAINT "corrective_actions_space_id_spaces_id_fk";
--> statement-breakpoint
ALTER TABLE "corrective_actions" DROP CONSTRAINT "corrective_actions_floor_id_floors_id_fk";
--> statement-breakpoint
ALTER TABLE "findings" DROP CONSTRAINT "findings_site_id_sites_id_fk";
--> statement-breakpoint
ALTER TABLE "findings" DROP CONSTRAINT "findings_space_id_spaces_id_fk";
--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "retired_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "retired_by" uuid;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "retirement_id" uuid;--> statement-breakpoint
ALTER TABLE "floors" ADD COLUMN "retired_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "floors" ADD COLUMN "retired_by" uuid;--> statement-breakpoint
ALTER TABLE "floors" ADD COLUMN "retirement_id" uuid;--> statement-breakpoint
ALTER TABLE "spaces" ADD COLUMN "retired_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "spaces" ADD COLUMN "retired_by" uuid;--> statement-breakpoint
ALTER TABLE "spaces" ADD COLUMN "retirement_id" uuid;--> statement-breakpoint
ALTER TABLE "corrective_actions" ADD COLUMN "close_reason" "action_close_reason";--> statement-breakpoint
ALTER TABLE "sites" ADD CONSTRAINT "sites_retired_by_users_id_fk" FOREIGN KEY ("retired_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "floors" ADD CONSTRAINT "floors_retired_by_users_id_fk" FOREIGN KEY ("retired_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spaces" ADD CONSTRAINT "spaces_retired_by_users_id_fk" FOREIGN KEY ("retired_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audits" ADD CONSTRAINT "audits_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audits" ADD CONSTRAINT "audits_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_actions" ADD CONSTRAINT "corrective_actions_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_actions" ADD CONSTRAINT "corrective_actions_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_actions" ADD CONSTRAINT "corrective_actions_floor_id_floors_id_fk" FOREIGN KEY ("floor_id") REFERENCES "public"."floors"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
-- Every action closed before reasons were kept was closed by an auditor's verification.
UPDATE "corrective_actions" SET "close_reason" = 'verified' WHERE "status" = 'closed';
