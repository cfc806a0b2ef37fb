import { sql } from "drizzle-orm";
import {
  boolean,
  check,
  date,
  doublePrecision,
  index,
  integer,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  unique,
  uniqueIndex,
  uuid,
  varchar,
} from "drizzle-orm/pg-core";

import { doorStates, pressureUnits } from "../../../shared/schemas/pressure-readings";

import { correctiveActions } from "./actions";
import { spaces } from "./floors";
import { sites } from "./sites";
import { users } from "./users";

/**
 * Live room pressure. The raw readings themselves live in `pressure_readings`, a table partitioned
 * by month that a hand-written migration creates (server/db/partitioned/pressure-readings.ts); the
 * tables here are ordinary and drizzle-kit keeps them.
 */

export const pressureUnitEnum = pgEnum("pressure_unit", pressureUnits);
export const doorStateEnum = pgEnum("door_state", doorStates);

/** Why a monitor's row in the alarm log exists: the room out of range, or the monitor silent. */
export const pressureAlarmKinds = ["out_of_range", "no_readings"] as const;
export const pressureAlarmKindEnum = pgEnum("pressure_alarm_kind", pressureAlarmKinds);

/**
 * A monitor as the building names it (the id in its topic), mapped to the room it watches.
 * Readings are kept for any monitor id; only a mapped monitor in a space still in use alarms.
 */
export const pressureMonitors = pgTable(
  "pressure_monitors",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    /** The building's id for the monitor: one MQTT topic level. Unique across Lintel. */
    monitorId: varchar("monitor_id", { length: 64 }).notNull().unique(),
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "restrict" }),
    spaceId: uuid("space_id")
      .notNull()
      .references(() => spaces.id, { onDelete: "restrict" }),
    /** The room's own threshold in Pa (negative); null means Lintel's default. */
    thresholdPa: doublePrecision("threshold_pa"),
    /** Readings up to here have been judged for alarms. */
    evaluatedThrough: timestamp("evaluated_through", { withTimezone: true }),
    createdBy: uuid("created_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex("pressure_monitors_one_per_space").on(table.spaceId),
    index("pressure_monitors_site_idx").on(table.siteId),
    check(
      "pressure_monitors_threshold_negative",
      sql`${table.thresholdPa} is null or (${table.thresholdPa} < 0 and ${table.thresholdPa} >= -100)`,
    ),
  ],
);

/**
 * Which room a monitor id watched, and when. Kept by a trigger on `pressure_monitors` (migration
 * 0019): each mapping opens a row, a change of id or room closes it and opens the next, taking the
 * monitor off closes it. The committee counts a monitor's hours for the room it watched at the
 * time, so a replaced or moved monitor leaves its past with the room it was in. A monitor id's
 * first mapping reaches back to its first reading (`mapped_at` is -infinity): readings kept
 * before anyone mapped it count for the room it was then mapped to.
 */
export const pressureMonitorMappings = pgTable(
  "pressure_monitor_mappings",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    monitorId: varchar("monitor_id", { length: 64 }).notNull(),
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    spaceId: uuid("space_id")
      .notNull()
      .references(() => spaces.id, { onDelete: "cascade" }),
    mappedAt: timestamp("mapped_at", { withTimezone: true }).notNull(),
    unmappedAt: timestamp("unmapped_at", { withTimezone: true }),
  },
  (table) => [
    index("pressure_monitor_mappings_site_idx").on(table.siteId, table.monitorId),
    index("pressure_monitor_mappings_monitor_idx").on(table.monitorId),
  ],
);

/** A site's alarm settings; no row means Lintel's defaults (shared/calc/pressure-excursions.ts). */
export const pressureSiteSettings = pgTable(
  "pressure_site_settings",
  {
    siteId: uuid("site_id")
      .primaryKey()
      .references(() => sites.id, { onDelete: "cascade" }),
    graceSeconds: integer("grace_seconds"),
    doorGraceSeconds: integer("door_grace_seconds"),
    actionLimitMinutes: integer("action_limit_minutes"),
    /** False until an administrator chooses the recipients: facilities leads and auditors by default. */
    recipientsChosen: boolean("recipients_chosen").notNull().default(false),
    updatedBy: uuid("updated_by").references(() => users.id, { onDelete: "set null" }),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    check(
      "pressure_site_settings_sensible",
      sql`coalesce(${table.graceSeconds}, 0) >= 0 and coalesce(${table.doorGraceSeconds}, 0) >= 0 and coalesce(${table.actionLimitMinutes}, 1) >= 1`,
    ),
  ],
);

/** Who an excursion e-mails, once the site's administrator has chosen. */
export const pressureAlarmRecipients = pgTable(
  "pressure_alarm_recipients",
  {
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    userId: uuid("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [primaryKey({ columns: [table.siteId, table.userId] })],
);

/**
 * One alarm: a room out of range past its grace (an excursion), or a monitor silent too long.
 * Written by the alarm job from the readings' own timestamps; e-mailed through the outbox once when
 * it starts and once when it ends.
 */
export const pressureAlarms = pgTable(
  "pressure_alarms",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    /** The mapping that raised it; null once the monitor was taken off the room. */
    monitorRowId: uuid("monitor_row_id").references(() => pressureMonitors.id, {
      onDelete: "set null",
    }),
    monitorId: varchar("monitor_id", { length: 64 }).notNull(),
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "restrict" }),
    spaceId: uuid("space_id")
      .notNull()
      .references(() => spaces.id, { onDelete: "restrict" }),
    kind: pressureAlarmKindEnum("kind").notNull(),
    /** The first reading out of range, or the last reading before the silence. */
    startedAt: timestamp("started_at", { withTimezone: true }).notNull(),
    /** When the grace ran out (out of range) or the silence reached its limit (no readings). */
    alarmAt: timestamp("alarm_at", { withTimezone: true }).notNull(),
    endedAt: timestamp("ended_at", { withTimezone: true }),
    /** Out of range only: the worst reading, as sent and in Pa. */
    worstValue: doublePrecision("worst_value"),
    worstUnit: pressureUnitEnum("worst_unit"),
    worstPa: doublePrecision("worst_pa"),
    worstAt: timestamp("worst_at", { withTimezone: true }),
    /** Set when the excursion passed the action limit: it became a critical finding. */
    criticalAt: timestamp("critical_at", { withTimezone: true }),
    actionId: uuid("action_id").references(() => correctiveActions.id, { onDelete: "set null" }),
    startMailedAt: timestamp("start_mailed_at", { withTimezone: true }),
    endMailedAt: timestamp("end_mailed_at", { withTimezone: true }),
    acknowledgedAt: timestamp("acknowledged_at", { withTimezone: true }),
    acknowledgedBy: uuid("acknowledged_by").references(() => users.id, { onDelete: "set null" }),
    acknowledgementNote: text("acknowledgement_note"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    unique("pressure_alarms_once").on(table.monitorRowId, table.kind, table.startedAt),
    index("pressure_alarms_site_open_idx").on(table.siteId, table.endedAt),
    index("pressure_alarms_space_idx").on(table.spaceId, table.startedAt),
  ],
);

/**
 * A token a building without a broker uploads readings with, for one site. Only its SHA-256 is
 * kept; the token is shown once when made.
 */
export const pressureUploadTokens = pgTable(
  "pressure_upload_tokens",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    siteId: uuid("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    name: varchar("name", { length: 80 }).notNull(),
    tokenHash: varchar("token_hash", { length: 64 }).notNull().unique(),
    createdBy: uuid("created_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    lastUsedAt: timestamp("last_used_at", { withTimezone: true }),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    revokedBy: uuid("revoked_by").references(() => users.id, { onDelete: "set null" }),
  },
  (table) => [index("pressure_upload_tokens_site_idx").on(table.siteId)],
);

/** Counts of what ingestion did, a day and a source at a time (stored, duplicate, refused). */
export const pressureIngestTallies = pgTable(
  "pressure_ingest_tallies",
  {
    day: date("day", { mode: "string" }).notNull(),
    /** "mqtt" or "upload". */
    source: varchar("source", { length: 16 }).notNull(),
    /** "stored", "duplicate", "future", "invalid", "wrong_site". */
    outcome: varchar("outcome", { length: 16 }).notNull(),
    count: integer("count").notNull().default(0),
  },
  (table) => [primaryKey({ columns: [table.day, table.source, table.outcome] })],
);

/** Roll-up columns: enough to give the mean, the extremes and the share of time with the door open. */
const rollUpColumns = () => ({
  monitorId: varchar("monitor_id", { length: 64 }).notNull(),
  bucketStart: timestamp("bucket_start", { withTimezone: true }).notNull(),
  readings: integer("readings").notNull(),
  sumPa: doublePrecision("sum_pa").notNull(),
  minPa: doublePrecision("min_pa").notNull(),
  maxPa: doublePrecision("max_pa").notNull(),
  doorOpenReadings: integer("door_open_readings").notNull().default(0),
});

/** One row a monitor and minute, updated only when a raw reading was actually inserted. */
export const pressureMinutes = pgTable("pressure_minutes", rollUpColumns(), (table) => [
  primaryKey({ columns: [table.monitorId, table.bucketStart] }),
]);

/**
 * One row a monitor and hour; kept for years, after the raw readings are dropped. It also counts
 * the minutes of the hour that had a reading, so monitored time is read from these rows (sixty
 * times fewer than the minutes) by the committee's figures.
 */
export const pressureHours = pgTable(
  "pressure_hours",
  {
    ...rollUpColumns(),
    minutesWithReadings: integer("minutes_with_readings").notNull().default(0),
  },
  (table) => [primaryKey({ columns: [table.monitorId, table.bucketStart] })],
);
