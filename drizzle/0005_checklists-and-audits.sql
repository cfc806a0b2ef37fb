CREATE TYPE "public"."audit_status" AS ENUM('draft', 'submitted');--> statement-breakpoint
CREATE TYPE "public"."outcome" AS ENUM('pass', 'fail', 'not_applicable');--> statement-breakpoint
CREATE TYPE "public"."verdict" AS ENUM('not_ready', 'ready_with_conditions', 'ready');--> statement-breakpoint
CREATE TYPE "public"."checklist_status" AS ENUM('draft', 'published');--> statement-breakpoint
CREATE TYPE "public"."response_kind" AS ENUM('check', 'reading', 'count', 'choice');--> statement-breakpoint
CREATE TYPE "public"."severity" AS ENUM('critical', 'major', 'minor');--> statement-breakpoint
CREATE TABLE "audit_answers" (
	"id" uuid PRIMARY KEY NOT NULL,
	"audit_id" uuid NOT NULL,
	"item_id" uuid NOT NULL,
	"outcome" "outcome",
	"value" double precision,
	"unit" varchar(10),
	"count" integer,
	"choice" varchar(40),
	"note" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "audit_answers_item_unique" UNIQUE("audit_id","item_id")
);
--> statement-breakpoint
CREATE TABLE "audit_photos" (
	"id" uuid PRIMARY KEY NOT NULL,
	"audit_id" uuid NOT NULL,
	"item_id" uuid,
	"image_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "audits" (
	"id" uuid PRIMARY KEY NOT NULL,
	"site_id" uuid NOT NULL,
	"space_id" uuid NOT NULL,
	"checklist_version_id" uuid NOT NULL,
	"auditor_id" uuid NOT NULL,
	"status" "audit_status" DEFAULT 'draft' NOT NULL,
	"started_at" timestamp with time zone NOT NULL,
	"submitted_at" timestamp with time zone,
	"verdict" "verdict",
	"score" double precision,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "space_cadences" (
	"space_id" uuid PRIMARY KEY NOT NULL,
	"cadence_days" integer NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "checklist_items" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"version_id" uuid NOT NULL,
	"key" varchar(60) NOT NULL,
	"position" integer NOT NULL,
	"text" varchar(300) NOT NULL,
	"severity" "severity" NOT NULL,
	"response" "response_kind" NOT NULL,
	"quantity" text,
	"threshold_op" text,
	"threshold_value" double precision,
	"choices" jsonb,
	"reference" varchar(300),
	"photo_on_fail" boolean DEFAULT false NOT NULL,
	CONSTRAINT "checklist_items_key_unique" UNIQUE("version_id","key")
);
--> statement-breakpoint
CREATE TABLE "checklist_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"network_id" uuid NOT NULL,
	"zone_type" "zone_type" NOT NULL,
	"version" integer NOT NULL,
	"status" "checklist_status" NOT NULL,
	"title" varchar(120) NOT NULL,
	"published_at" timestamp with time zone,
	"published_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "checklist_versions_number_unique" UNIQUE("network_id","zone_type","version")
);
--> statement-breakpoint
ALTER TABLE "audit_answers" ADD CONSTRAINT "audit_answers_audit_id_audits_id_fk" FOREIGN KEY ("audit_id") REFERENCES "public"."audits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_answers" ADD CONSTRAINT "audit_answers_item_id_checklist_items_id_fk" FOREIGN KEY ("item_id") REFERENCES "public"."checklist_items"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_photos" ADD CONSTRAINT "audit_photos_audit_id_audits_id_fk" FOREIGN KEY ("audit_id") REFERENCES "public"."audits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_photos" ADD CONSTRAINT "audit_photos_item_id_checklist_items_id_fk" FOREIGN KEY ("item_id") REFERENCES "public"."checklist_items"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_photos" ADD CONSTRAINT "audit_photos_image_id_images_id_fk" FOREIGN KEY ("image_id") REFERENCES "public"."images"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audits" ADD CONSTRAINT "audits_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audits" ADD CONSTRAINT "audits_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audits" ADD CONSTRAINT "audits_checklist_version_id_checklist_versions_id_fk" FOREIGN KEY ("checklist_version_id") REFERENCES "public"."checklist_versions"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audits" ADD CONSTRAINT "audits_auditor_id_users_id_fk" FOREIGN KEY ("auditor_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "space_cadences" ADD CONSTRAINT "space_cadences_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checklist_items" ADD CONSTRAINT "checklist_items_version_id_checklist_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."checklist_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checklist_versions" ADD CONSTRAINT "checklist_versions_network_id_networks_id_fk" FOREIGN KEY ("network_id") REFERENCES "public"."networks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "checklist_versions" ADD CONSTRAINT "checklist_versions_published_by_users_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "audit_photos_audit_idx" ON "audit_photos" USING btree ("audit_id");--> statement-breakpoint
CREATE INDEX "audits_space_idx" ON "audits" USING btree ("space_id","submitted_at");--> statement-breakpoint
CREATE INDEX "audits_site_idx" ON "audits" USING btree ("site_id","submitted_at");--> statement-breakpoint
CREATE INDEX "checklist_items_version_idx" ON "checklist_items" USING btree ("version_id","position");--> statement-breakpoint
CREATE UNIQUE INDEX "checklist_versions_one_draft" ON "checklist_versions" USING btree ("network_id","zone_type") WHERE status = 'draft';