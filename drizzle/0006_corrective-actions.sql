CREATE TYPE "public"."action_status" AS ENUM('open', 'in_progress', 'awaiting_verification', 'closed');--> statement-breakpoint
CREATE TABLE "action_notices" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"action_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "action_notices_unique" UNIQUE("action_id","kind")
);
--> statement-breakpoint
CREATE TABLE "action_proofs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"action_id" uuid NOT NULL,
	"image_id" uuid NOT NULL,
	"round" integer NOT NULL,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "corrective_actions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"space_id" uuid NOT NULL,
	"floor_id" uuid NOT NULL,
	"item_key" varchar(60) NOT NULL,
	"title" varchar(300) NOT NULL,
	"severity" "severity" NOT NULL,
	"status" "action_status" DEFAULT 'open' NOT NULL,
	"assignee_id" uuid,
	"opened_at" timestamp with time zone NOT NULL,
	"due_at" timestamp with time zone NOT NULL,
	"closed_at" timestamp with time zone,
	"days_to_close" double precision,
	"proof_round" integer DEFAULT 0 NOT NULL,
	"x" double precision NOT NULL,
	"y" double precision NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "findings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"action_id" uuid NOT NULL,
	"audit_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"space_id" uuid NOT NULL,
	"item_id" uuid NOT NULL,
	"item_key" varchar(60) NOT NULL,
	"item_text" varchar(300) NOT NULL,
	"severity" "severity" NOT NULL,
	"note" text,
	"x" double precision NOT NULL,
	"y" double precision NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "findings_audit_item_unique" UNIQUE("audit_id","item_id")
);
--> statement-breakpoint
CREATE TABLE "site_due_policies" (
	"site_id" uuid PRIMARY KEY NOT NULL,
	"policy" jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "action_notices" ADD CONSTRAINT "action_notices_action_id_corrective_actions_id_fk" FOREIGN KEY ("action_id") REFERENCES "public"."corrective_actions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "action_proofs" ADD CONSTRAINT "action_proofs_action_id_corrective_actions_id_fk" FOREIGN KEY ("action_id") REFERENCES "public"."corrective_actions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "action_proofs" ADD CONSTRAINT "action_proofs_image_id_images_id_fk" FOREIGN KEY ("image_id") REFERENCES "public"."images"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "action_proofs" ADD CONSTRAINT "action_proofs_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_actions" ADD CONSTRAINT "corrective_actions_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_actions" ADD CONSTRAINT "corrective_actions_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_actions" ADD CONSTRAINT "corrective_actions_floor_id_floors_id_fk" FOREIGN KEY ("floor_id") REFERENCES "public"."floors"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "corrective_actions" ADD CONSTRAINT "corrective_actions_assignee_id_users_id_fk" FOREIGN KEY ("assignee_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_action_id_corrective_actions_id_fk" FOREIGN KEY ("action_id") REFERENCES "public"."corrective_actions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_audit_id_audits_id_fk" FOREIGN KEY ("audit_id") REFERENCES "public"."audits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "findings" ADD CONSTRAINT "findings_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_due_policies" ADD CONSTRAINT "site_due_policies_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "action_proofs_action_idx" ON "action_proofs" USING btree ("action_id");--> statement-breakpoint
CREATE UNIQUE INDEX "corrective_actions_one_unclosed" ON "corrective_actions" USING btree ("space_id","item_key") WHERE status <> 'closed';--> statement-breakpoint
CREATE INDEX "corrective_actions_site_idx" ON "corrective_actions" USING btree ("site_id","status","due_at");--> statement-breakpoint
CREATE INDEX "corrective_actions_assignee_idx" ON "corrective_actions" USING btree ("assignee_id","status");--> statement-breakpoint
CREATE INDEX "corrective_actions_floor_idx" ON "corrective_actions" USING btree ("floor_id","status");--> statement-breakpoint
CREATE INDEX "findings_action_idx" ON "findings" USING btree ("action_id");