CREATE TYPE "public"."breach_cause" AS ENUM('technique', 'space');--> statement-breakpoint
CREATE TYPE "public"."breach_kind" AS ENUM('out_of_order', 'step_skipped', 'hand_hygiene_missed', 'touched_face_or_clean_clothing', 'item_dropped_or_wrong_container', 'assistant_needed');--> statement-breakpoint
CREATE TYPE "public"."observation_outcome" AS ENUM('clean_run', 'breaches_seen');--> statement-breakpoint
CREATE TYPE "public"."sequence_kind" AS ENUM('putting_on', 'removal');--> statement-breakpoint
CREATE TYPE "public"."space_problem" AS ENUM('no_hand_rub_within_reach', 'bin_full', 'no_clean_dirty_separation');--> statement-breakpoint
CREATE TYPE "public"."staff_role" AS ENUM('nurse', 'doctor', 'healthcare_assistant', 'therapist', 'cleaning_staff', 'porter', 'student', 'other');--> statement-breakpoint
CREATE TABLE "observation_breaches" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"observation_id" uuid NOT NULL,
	"step_id" uuid NOT NULL,
	"kind" "breach_kind" NOT NULL,
	"cause" "breach_cause" NOT NULL,
	"space_problem" "space_problem",
	"note" text,
	"action_id" uuid
);
--> statement-breakpoint
CREATE TABLE "observation_settings" (
	"network_id" uuid PRIMARY KEY NOT NULL,
	"retention_days" integer DEFAULT 730 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "observation_steps" (
	"observation_id" uuid NOT NULL,
	"step_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"done" boolean NOT NULL,
	"breached" boolean NOT NULL,
	CONSTRAINT "observation_steps_observation_id_step_id_pk" PRIMARY KEY("observation_id","step_id")
);
--> statement-breakpoint
CREATE TABLE "observations" (
	"id" uuid PRIMARY KEY NOT NULL,
	"site_id" uuid NOT NULL,
	"space_id" uuid NOT NULL,
	"sequence_version_id" uuid NOT NULL,
	"observer_id" uuid NOT NULL,
	"staff_code" varchar(16),
	"staff_role" "staff_role" NOT NULL,
	"started_at" timestamp with time zone NOT NULL,
	"finished_at" timestamp with time zone NOT NULL,
	"outcome" "observation_outcome" NOT NULL,
	"breach_count" integer NOT NULL,
	"hand_hygiene_performed" integer NOT NULL,
	"hand_hygiene_expected" integer NOT NULL,
	"coaching_given" boolean NOT NULL,
	"coaching_note" text,
	"precheck" jsonb,
	"body_hash" varchar(64) NOT NULL,
	"detail_removed_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sequence_steps" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"version_id" uuid NOT NULL,
	"key" varchar(60) NOT NULL,
	"position" integer NOT NULL,
	"text" varchar(300) NOT NULL,
	"hand_hygiene" boolean DEFAULT false NOT NULL,
	"watch_for" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"reference" varchar(300),
	CONSTRAINT "sequence_steps_key_unique" UNIQUE("version_id","key")
);
--> statement-breakpoint
CREATE TABLE "sequence_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"network_id" uuid NOT NULL,
	"key" varchar(60) NOT NULL,
	"kind" "sequence_kind" NOT NULL,
	"version" integer NOT NULL,
	"status" "checklist_status" NOT NULL,
	"title" varchar(120) NOT NULL,
	"note" varchar(300),
	"published_at" timestamp with time zone,
	"published_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "sequence_versions_number_unique" UNIQUE("network_id","key","version")
);
--> statement-breakpoint
ALTER TABLE "observation_breaches" ADD CONSTRAINT "observation_breaches_observation_id_observations_id_fk" FOREIGN KEY ("observation_id") REFERENCES "public"."observations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observation_breaches" ADD CONSTRAINT "observation_breaches_step_id_sequence_steps_id_fk" FOREIGN KEY ("step_id") REFERENCES "public"."sequence_steps"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observation_breaches" ADD CONSTRAINT "observation_breaches_action_id_corrective_actions_id_fk" FOREIGN KEY ("action_id") REFERENCES "public"."corrective_actions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observation_settings" ADD CONSTRAINT "observation_settings_network_id_networks_id_fk" FOREIGN KEY ("network_id") REFERENCES "public"."networks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observation_steps" ADD CONSTRAINT "observation_steps_observation_id_observations_id_fk" FOREIGN KEY ("observation_id") REFERENCES "public"."observations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observation_steps" ADD CONSTRAINT "observation_steps_step_id_sequence_steps_id_fk" FOREIGN KEY ("step_id") REFERENCES "public"."sequence_steps"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observations" ADD CONSTRAINT "observations_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observations" ADD CONSTRAINT "observations_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observations" ADD CONSTRAINT "observations_sequence_version_id_sequence_versions_id_fk" FOREIGN KEY ("sequence_version_id") REFERENCES "public"."sequence_versions"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "observations" ADD CONSTRAINT "observations_observer_id_users_id_fk" FOREIGN KEY ("observer_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sequence_steps" ADD CONSTRAINT "sequence_steps_version_id_sequence_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."sequence_versions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sequence_versions" ADD CONSTRAINT "sequence_versions_network_id_networks_id_fk" FOREIGN KEY ("network_id") REFERENCES "public"."networks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sequence_versions" ADD CONSTRAINT "sequence_versions_published_by_users_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "observation_breaches_observation_idx" ON "observation_breaches" USING btree ("observation_id");--> statement-breakpoint
CREATE INDEX "observations_site_idx" ON "observations" USING btree ("site_id","finished_at");--> statement-breakpoint
CREATE INDEX "observations_staff_idx" ON "observations" USING btree ("site_id","staff_code","finished_at");--> statement-breakpoint
CREATE INDEX "sequence_steps_version_idx" ON "sequence_steps" USING btree ("version_id","position");--> statement-breakpoint
CREATE UNIQUE INDEX "sequence_versions_one_draft" ON "sequence_versions" USING btree ("network_id","key") WHERE status = 'draft';