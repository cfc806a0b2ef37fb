CREATE TABLE "pressure_monitor_mappings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"monitor_id" varchar(64) NOT NULL,
	"site_id" uuid NOT NULL,
	"space_id" uuid NOT NULL,
	"mapped_at" timestamp with time zone NOT NULL,
	"unmapped_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "pressure_alarms" DROP CONSTRAINT "pressure_alarms_monitor_row_id_pressure_monitors_id_fk";
--> statement-breakpoint
ALTER TABLE "pressure_alarms" ALTER COLUMN "monitor_row_id" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "pressure_monitor_mappings" ADD CONSTRAINT "pressure_monitor_mappings_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pressure_monitor_mappings" ADD CONSTRAINT "pressure_monitor_mappings_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "pressure_monitor_mappings_site_idx" ON "pressure_monitor_mappings" USING btree ("site_id","monitor_id");--> statement-breakpoint
CREATE INDEX "pressure_monitor_mappings_monitor_idx" ON "pressure_monitor_mappings" USING btree ("monitor_id");--> statement-breakpoint
ALTER TABLE "pressure_alarms" ADD CONSTRAINT "pressure_alarms_monitor_row_id_pressure_monitors_id_fk" FOREIGN KEY ("monitor_row_id") REFERENCES "public"."pressure_monitors"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
-- Every mapping as it stands: the monitors mapped now reach back to their first reading.
INSERT INTO "pressure_monitor_mappings" ("monitor_id", "site_id", "space_id", "mapped_at")
SELECT "monitor_id", "site_id", "space_id", '-infinity' FROM "pressure_monitors";--> statement-breakpoint
-- The history follows pressure_monitors whoever writes it: a mapping opens a row (reaching back
-- to the monitor's first reading when the id was never mapped before), a change of id or room
-- closes it and opens the next, taking the monitor off closes it.
CREATE FUNCTION lintel_pressure_mapping_history() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' OR (TG_OP = 'UPDATE' AND (OLD.monitor_id IS DISTINCT FROM NEW.monitor_id
                                                OR OLD.space_id IS DISTINCT FROM NEW.space_id)) THEN
    UPDATE pressure_monitor_mappings SET unmapped_at = now()
     WHERE monitor_id = OLD.monitor_id AND space_id = OLD.space_id AND unmapped_at IS NULL;
  END IF;
  IF TG_OP = 'INSERT' OR (TG_OP = 'UPDATE' AND (OLD.monitor_id IS DISTINCT FROM NEW.monitor_id
                                                OR OLD.space_id IS DISTINCT FROM NEW.space_id)) THEN
    INSERT INTO pressure_monitor_mappings (monitor_id, site_id, space_id, mapped_at)
    VALUES (NEW.monitor_id, NEW.site_id, NEW.space_id,
            CASE WHEN EXISTS (SELECT 1 FROM pressure_monitor_mappings WHERE monitor_id = NEW.monitor_id)
                 THEN now() ELSE '-infinity'::timestamptz END);
  END IF;
  RETURN NULL;
END $$;--> statement-breakpoint
CREATE TRIGGER pressure_monitors_mapping_history
  AFTER INSERT OR UPDATE OR DELETE ON pressure_monitors
  FOR EACH ROW EXECUTE FUNCTION lintel_pressure_mapping_history();
