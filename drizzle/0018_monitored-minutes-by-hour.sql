ALTER TABLE "pressure_hours" ADD COLUMN "minutes_with_readings" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
-- Hours stored before the count was kept take it from their minutes.
UPDATE "pressure_hours" h SET "minutes_with_readings" = (
	SELECT count(*) FROM "pressure_minutes" m
	 WHERE m."monitor_id" = h."monitor_id"
	   AND m."bucket_start" >= h."bucket_start" AND m."bucket_start" < h."bucket_start" + interval '1 hour');
