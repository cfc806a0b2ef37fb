-- Hand-written: drizzle-kit cannot write a partitioned table. The declaration the queries use is
-- server/db/partitioned/pressure-readings.ts, kept out of the schema the drift check compares.
--
-- Raw monitor readings, one partition a month on measured_at, a DEFAULT partition for anything no
-- monthly partition holds yet (so no reading is ever refused for want of one), a BRIN index on
-- the time (readings arrive nearly in time order), and the unique key that makes at-least-once
-- delivery idempotent (it includes the partition column, as PostgreSQL requires).
CREATE TABLE "pressure_readings" (
	"monitor_id" varchar(64) NOT NULL,
	"measured_at" timestamp with time zone NOT NULL,
	"pressure" double precision NOT NULL,
	"unit" "pressure_unit" NOT NULL,
	"pressure_pa" double precision NOT NULL,
	"door" "door_state",
	"received_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "pressure_readings_once" UNIQUE ("monitor_id", "measured_at"),
	CONSTRAINT "pressure_readings_plausible" CHECK ("pressure_pa" BETWEEN -100 AND 100)
) PARTITION BY RANGE ("measured_at");
--> statement-breakpoint
CREATE TABLE "pressure_readings_default" PARTITION OF "pressure_readings" DEFAULT;
--> statement-breakpoint
CREATE INDEX "pressure_readings_time_brin" ON "pressure_readings" USING brin ("measured_at");
--> statement-breakpoint
-- Makes the partition for the month holding `month` (idempotent). Rows that already fell into
-- the DEFAULT partition for that month are moved into the new one, under a lock that holds
-- ingestion back for the moment it takes.
CREATE FUNCTION lintel_pressure_partition(month timestamptz) RETURNS text
LANGUAGE plpgsql AS $$
DECLARE
	from_ts timestamptz := date_trunc('month', month AT TIME ZONE 'UTC') AT TIME ZONE 'UTC';
	to_ts timestamptz := (date_trunc('month', month AT TIME ZONE 'UTC') + interval '1 month') AT TIME ZONE 'UTC';
	name text := 'pressure_readings_' || to_char(from_ts AT TIME ZONE 'UTC', 'YYYY_MM');
BEGIN
	IF to_regclass(name) IS NOT NULL THEN
		RETURN name;
	END IF;
	LOCK TABLE pressure_readings IN SHARE ROW EXCLUSIVE MODE;
	EXECUTE format('CREATE TABLE %I (LIKE pressure_readings INCLUDING DEFAULTS INCLUDING CONSTRAINTS)', name);
	EXECUTE format(
		'WITH moved AS (DELETE FROM pressure_readings_default WHERE measured_at >= %L AND measured_at < %L RETURNING *) INSERT INTO %I SELECT * FROM moved',
		from_ts, to_ts, name);
	EXECUTE format('ALTER TABLE pressure_readings ATTACH PARTITION %I FOR VALUES FROM (%L) TO (%L)', name, from_ts, to_ts);
	RETURN name;
END $$;
--> statement-breakpoint
SELECT lintel_pressure_partition(now() - interval '1 month'),
	lintel_pressure_partition(now()),
	lintel_pressure_partition(now() + interval '1 month'),
	lintel_pressure_partition(now() + interval '2 months');
