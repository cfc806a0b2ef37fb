CREATE TYPE "public"."door_state" AS ENUM('open', 'closed');--> statement-breakpoint
CREATE TYPE "public"."pressure_alarm_kind" AS ENUM('out_of_range', 'no_readings');--> statement-breakpoint
CREATE TYPE "public"."pressure_unit" AS ENUM('Pa', 'inH2O');--> statement-breakpoint
CREATE TABLE "pressure_alarm_recipients" (
	"site_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "pressure_alarm_recipients_site_id_user_id_pk" PRIMARY KEY("site_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "pressure_alarms" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"monitor_row_id" uuid NOT NULL,
	"monitor_id" varchar(64) NOT NULL,
	"site_id" uuid NOT NULL,
	"space_id" uuid NOT NULL,
	"kind" "pressure_alarm_kind" NOT NULL,
	"started_at" timestamp with time zone NOT NULL,
	"alarm_at" timestamp with time zone NOT NULL,
	"ended_at" timestamp with time zone,
	"worst_value" double precision,
	"worst_unit" "pressure_unit",
	"worst_pa" double precision,
	"worst_at" timestamp with time zone,
	"critical_at" timestamp with time zone,
	"action_id" uuid,
	"start_mailed_at" timestamp with time zone,
	"end_mailed_at" timestamp with time zone,
	"acknowledged_at" timestamp with time zone,
	"acknowledged_by" uuid,
	"acknowledgement_note" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "pressure_alarms_once" UNIQUE("monitor_row_id","kind","started_at")
);
--> statement-breakpoint
CREATE TABLE "pressure_hours" (
	"monitor_id" varchar(64) NOT NULL,
	"bucket_start" timestamp with time zone NOT NULL,
	"readings" integer NOT NULL,
	"sum_pa" double precision NOT NULL,
	"min_pa" double precision NOT NULL,
	"max_pa" double precision NOT NULL,
	"door_open_readings" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "pressure_hours_monitor_id_bucket_start_pk" PRIMARY KEY("monitor_id","bucket_start")
);
--> statement-breakpoint
CREATE TABLE "pressure_ingest_tallies" (
	"day" date NOT NULL,
	"source" varchar(16) NOT NULL,
	"outcome" varchar(16) NOT NULL,
	"count" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "pressure_ingest_tallies_day_source_outcome_pk" PRIMARY KEY("day","source","outcome")
);
--> statement-breakpoint
CREATE TABLE "pressure_minutes" (
	"monitor_id" varchar(64) NOT NULL,
	"bucket_start" timestamp with time zone NOT NULL,
	"readings" integer NOT NULL,
	"sum_pa" double precision NOT NULL,
	"min_pa" double precision NOT NULL,
	"max_pa" double precision NOT NULL,
	"door_open_readings" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "pressure_minutes_monitor_id_bucket_start_pk" PRIMARY KEY("monitor_id","bucket_start")
);
--> statement-breakpoint
CREATE TABLE "pressure_monitors" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"monitor_id" varchar(64) NOT NULL,
	"site_id" uuid NOT NULL,
	"space_id" uuid NOT NULL,
	"threshold_pa" double precision,
	"evaluated_through" timestamp with time zone,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "pressure_monitors_monitor_id_unique" UNIQUE("monitor_id"),
	CONSTRAINT "pressure_monitors_threshold_negative" CHECK ("pressure_monitors"."threshold_pa" is null or ("pressure_monitors"."threshold_pa" < 0 and "pressure_monitors"."threshold_pa" >= -100))
);
--> statement-breakpoint
CREATE TABLE "pressure_site_settings" (
	"site_id" uuid PRIMARY KEY NOT NULL,
	"grace_seconds" integer,
	"door_grace_seconds" integer,
	"action_limit_minutes" integer,
	"recipients_chosen" boolean DEFAULT false NOT NULL,
	"updated_by" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "pressure_site_settings_sensible" CHECK (coalesce("pressure_site_settings"."grace_seconds", 0) >= 0 and coalesce("pressure_site_settings"."door_grace_seconds", 0) >= 0 and coalesce("pressure_site_settings"."action_limit_minutes", 1) >= 1)
);
--> statement-breakpoint
CREATE TABLE "pressure_upload_tokens" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"name" varchar(80) NOT NULL,
	"token_hash" varchar(64) NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_used_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	"revoked_by" uuid,
	CONSTRAINT "pressure_upload_tokens_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
ALTER TABLE "pressure_alarm_recipients" ADD CONSTRAINT "pressure_alarm_recipients_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_alarm_recipients" ADD CONSTRAINT "pressure_alarm_recipients_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_alarms" ADD CONSTRAINT "pressure_alarms_monitor_row_id_pressure_monitors_id_fk" FOREIGN KEY ("monitor_row_id") REFERENCES "public"."pressure_monitors"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_alarms" ADD CONSTRAINT "pressure_alarms_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_alarms" ADD CONSTRAINT "pressure_alarms_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_alarms" ADD CONSTRAINT "pressure_alarms_action_id_corrective_actions_id_fk" FOREIGN KEY ("action_id") REFERENCES "public"."corrective_actions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_alarms" ADD CONSTRAINT "pressure_alarms_acknowledged_by_users_id_fk" FOREIGN KEY ("acknowledged_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_monitors" ADD CONSTRAINT "pressure_monitors_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_monitors" ADD CONSTRAINT "pressure_monitors_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_monitors" ADD CONSTRAINT "pressure_monitors_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_site_settings" ADD CONSTRAINT "pressure_site_settings_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_site_settings" ADD CONSTRAINT "pressure_site_settings_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_upload_tokens" ADD CONSTRAINT "pressure_upload_tokens_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_upload_tokens" ADD CONSTRAINT "pressure_upload_tokens_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_upload_tokens" ADD CONSTRAINT "pressure_upload_tokens_revoked_by_users_id_fk" FOREIGN KEY ("revoked_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "pressure_alarms_site_open_idx" ON "pressure_alarms" USING btree ("site_id","ended_at");--> statement-breakpoint
CREATE INDEX "pressure_alarms_space_idx" ON "pressure_alarms" USING btree ("space_id","started_at");--> statement-breakpoint
CREATE UNIQUE INDEX "pressure_monitors_one_per_space" ON "pressure_monitors" USING btree ("space_id");--> statement-breakpoint
CREATE INDEX "pressure_monitors_site_idx" ON "pressure_monitors" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "pressure_upload_tokens_site_idx" ON "pressure_upload_tokens" USING btree ("site_id");