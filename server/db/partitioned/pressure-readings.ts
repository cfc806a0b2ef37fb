import { doublePrecision, pgTable, timestamp, varchar } from "drizzle-orm/pg-core";

import { doorStateEnum, pressureUnitEnum } from "../schema/pressure";

/**
 * Raw monitor readings, partitioned by month on `measured_at` (native partitioning, with a DEFAULT
 * partition so that no reading is ever refused for want of one). drizzle-kit cannot write a
 * partitioned table, so the hand-written migration `drizzle/0017_pressure-readings-partitioned.sql`
 * creates it and this declaration is kept out of `server/db/schema/index.ts`: the drift check
 * (scripts/check-migrations.ts) skips it by name and checks the live table instead.
 *
 * The unique key is (monitor_id, measured_at): a redelivered reading is stored once.
 */
export const pressureReadings = pgTable("pressure_readings", {
  monitorId: varchar("monitor_id", { length: 64 }).notNull(),
  measuredAt: timestamp("measured_at", { withTimezone: true }).notNull(),
  /** As sent, in `unit`. */
  pressure: doublePrecision("pressure").notNull(),
  unit: pressureUnitEnum("unit").notNull(),
  /** The same differential in Pa, Lintel's stored unit. */
  pressurePa: doublePrecision("pressure_pa").notNull(),
  door: doorStateEnum("door"),
  receivedAt: timestamp("received_at", { withTimezone: true }).notNull().defaultNow(),
});

/** The tables hand-written migrations own, which the drift check leaves to them. */
export const handWrittenTables = ["pressure_readings"] as const;
