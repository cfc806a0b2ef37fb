CREATE TABLE "answer_month_stats" (
	"site_id" uuid NOT NULL,
	"zone_type" "zone_type" NOT NULL,
	"month" date NOT NULL,
	"category" varchar(30) NOT NULL,
	"applicable" integer DEFAULT 0 NOT NULL,
	"passed" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "answer_month_stats_site_id_zone_type_month_category_pk" PRIMARY KEY("site_id","zone_type","month","category")
);
--> statement-breakpoint
CREATE TABLE "audit_month_stats" (
	"site_id" uuid NOT NULL,
	"zone_type" "zone_type" NOT NULL,
	"month" date NOT NULL,
	"audits" integer DEFAULT 0 NOT NULL,
	"ready" integer DEFAULT 0 NOT NULL,
	"with_conditions" integer DEFAULT 0 NOT NULL,
	"not_ready" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "audit_month_stats_site_id_zone_type_month_pk" PRIMARY KEY("site_id","zone_type","month")
);
--> statement-breakpoint
CREATE TABLE "item_category_keys" (
	"key" varchar(60) PRIMARY KEY NOT NULL,
	"category" varchar(30) NOT NULL
);
--> statement-breakpoint
ALTER TABLE "answer_month_stats" ADD CONSTRAINT "answer_month_stats_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_month_stats" ADD CONSTRAINT "audit_month_stats_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "corrective_actions_closed_idx" ON "corrective_actions" USING btree ("site_id","closed_at");