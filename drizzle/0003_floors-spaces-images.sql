CREATE TYPE "public"."construction_class" AS ENUM('new_or_renovated', 'existing');--> statement-breakpoint
CREATE TYPE "public"."fixture_kind" AS ENUM('hand_rub_station', 'clean_chair', 'dirty_chair', 'hands_free_bin', 'mirror', 'glove_supply', 'wipes', 'ppe_stock', 'pressure_monitor', 'signage');--> statement-breakpoint
CREATE TYPE "public"."zone_type" AS ENUM('isolation_room', 'anteroom', 'donning_zone', 'doffing_area');--> statement-breakpoint
CREATE TABLE "fixtures" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"space_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"kind" "fixture_kind" NOT NULL,
	"x" double precision NOT NULL,
	"y" double precision NOT NULL,
	"label" varchar(80),
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "floors" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"building" varchar(80) NOT NULL,
	"level" integer NOT NULL,
	"name" varchar(80) NOT NULL,
	"plan_image_id" uuid,
	"plan_width" double precision,
	"plan_height" double precision,
	"metres_per_unit" double precision,
	"scale_reference" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "spaces" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"floor_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"zone_type" "zone_type" NOT NULL,
	"name" varchar(80) NOT NULL,
	"number" varchar(20),
	"polygon" jsonb NOT NULL,
	"suite_id" uuid,
	"construction_class" "construction_class",
	"volume_m3" double precision,
	"floor_area_m2" double precision,
	"ceiling_height_m" double precision,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "spaces_positive_measures" CHECK (coalesce("spaces"."volume_m3", 1) > 0 and coalesce("spaces"."floor_area_m2", 1) > 0 and coalesce("spaces"."ceiling_height_m", 1) > 0)
);
--> statement-breakpoint
CREATE TABLE "suites" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"floor_id" uuid NOT NULL,
	"name" varchar(80) NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "images" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"sha256" text NOT NULL,
	"display_key" text NOT NULL,
	"thumb_key" text NOT NULL,
	"content_type" text NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"bytes" integer NOT NULL,
	"original_bytes" integer NOT NULL,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "images_site_sha256_unique" UNIQUE("site_id","sha256")
);
--> statement-breakpoint
ALTER TABLE "fixtures" ADD CONSTRAINT "fixtures_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fixtures" ADD CONSTRAINT "fixtures_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "floors" ADD CONSTRAINT "floors_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "floors" ADD CONSTRAINT "floors_plan_image_id_images_id_fk" FOREIGN KEY ("plan_image_id") REFERENCES "public"."images"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spaces" ADD CONSTRAINT "spaces_floor_id_floors_id_fk" FOREIGN KEY ("floor_id") REFERENCES "public"."floors"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spaces" ADD CONSTRAINT "spaces_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "spaces" ADD CONSTRAINT "spaces_suite_id_suites_id_fk" FOREIGN KEY ("suite_id") REFERENCES "public"."suites"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "suites" ADD CONSTRAINT "suites_floor_id_floors_id_fk" FOREIGN KEY ("floor_id") REFERENCES "public"."floors"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "images" ADD CONSTRAINT "images_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "images" ADD CONSTRAINT "images_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "fixtures_space_idx" ON "fixtures" USING btree ("space_id");--> statement-breakpoint
CREATE INDEX "floors_site_idx" ON "floors" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "spaces_floor_idx" ON "spaces" USING btree ("floor_id");--> statement-breakpoint
CREATE INDEX "images_site_idx" ON "images" USING btree ("site_id");