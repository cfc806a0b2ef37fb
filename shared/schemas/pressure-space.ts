import { z } from "zod";

import { minimumNegativePressurePascals } from "../calc/ventilation";

import { numberInput, responseText, uuidSchema } from "./common";
import { doorStates, monitorIdSchema, pressureUnits } from "./pressure-readings";

/**
 * One room's pressure as its space page shows it: the monitor mapped to it, the live value and the
 * state now, the series for a chart (24 hours of one-minute means or 30 days of hourly means), the
 * same numbers grouped for a table, and the alarms in the range. Values are in Pa; the page shows
 * them in the monitor's unit.
 */

export const pressureRanges = ["24h", "30d"] as const;
export type PressureRange = (typeof pressureRanges)[number];

export const pressureSpaceQuerySchema = z.strictObject({
  range: z
    .enum(pressureRanges, { error: "Use 24h or 30d." })
    .optional()
    .transform((range) => range ?? "24h"),
});

/** The state now, in one word each; the page says it in words. */
export const pressureStates = [
  "in_range",
  "out_of_range",
  "excursion",
  "no_readings",
  "never_reported",
] as const;
export type PressureState = (typeof pressureStates)[number];

/** The most alarms one answer lists; the count says how many the range holds. */
export const maxListedAlarms = 100;

/** The least negative threshold a room may have: the CDC's 2.5 Pa negative to the corridor. */
export const leastNegativeThresholdPa = -minimumNegativePressurePascals;

/** Mapping a monitor to a room: the building's monitor id and, optionally, the room's own threshold. */
export const monitorMappingBodySchema = z.strictObject({
  monitorId: monitorIdSchema,
  thresholdPa: numberInput()
    .refine((value) => Number.isFinite(value), { message: "Enter a number of Pa." })
    .refine((value) => value <= leastNegativeThresholdPa && value >= -100, {
      message: `Use a figure from −${minimumNegativePressurePascals} Pa (the CDC's minimum) to −100 Pa, or leave it empty for Lintel's default.`,
    })
    .nullish()
    .transform((value) => value ?? null),
});
export type MonitorMappingBody = z.infer<typeof monitorMappingBodySchema>;

const isoTime = responseText();
const pressureUnitSchema = z.enum(pressureUnits);

export const pressureMonitorSchema = z.object({
  monitorId: responseText(),
  /** The room's threshold in Pa (negative); the default when the room has none of its own. */
  thresholdPa: z.number(),
  /** Whether the threshold is Lintel's default rather than the room's own. */
  thresholdIsDefault: z.boolean(),
  /** The unit the monitor reports in (from its latest reading; Pa before it has reported). */
  unit: pressureUnitSchema,
  /** The threshold as stated in that unit (−2.5 Pa is −0.01 in. w.c.). */
  thresholdInUnit: z.number(),
  /** The threshold and where it comes from, in words. */
  thresholdWords: responseText(),
  mappedAt: isoTime,
});
export type PressureMonitor = z.infer<typeof pressureMonitorSchema>;

export const pressureLiveSchema = z.object({
  state: z.enum(pressureStates),
  /** The latest reading, or null when the monitor has never reported. */
  latest: z
    .object({
      measuredAt: isoTime,
      pressure: z.number(),
      unit: pressureUnitSchema,
      pressurePa: z.number(),
      door: z.enum(doorStates).nullable(),
      meetsThreshold: z.boolean(),
    })
    .nullable(),
  /** The open alarm behind the state, when there is one. */
  openAlarmId: uuidSchema.nullable(),
});
export type PressureLive = z.infer<typeof pressureLiveSchema>;

/** One bucket of the chart: a minute (24 hours) or an hour (30 days). */
export const pressurePointSchema = z.object({
  at: isoTime,
  readings: z.number().int(),
  meanPa: z.number(),
  minPa: z.number(),
  maxPa: z.number(),
  doorOpenReadings: z.number().int(),
});
export type PressurePoint = z.infer<typeof pressurePointSchema>;

/** One row of the table: an hour (24 hours) or a day in the site's time zone (30 days). */
export const pressureTableRowSchema = z.object({
  from: isoTime,
  to: isoTime,
  readings: z.number().int(),
  /** Null for a row with no readings. */
  meanPa: z.number().nullable(),
  minPa: z.number().nullable(),
  maxPa: z.number().nullable(),
  /** Minutes of the row inside an excursion. */
  excursionMinutes: z.number(),
});
export type PressureTableRow = z.infer<typeof pressureTableRowSchema>;

export const pressureAlarmEntrySchema = z.object({
  id: uuidSchema,
  kind: z.enum(["out_of_range", "no_readings"]),
  startedAt: isoTime,
  /** Null while it is still going on. */
  endedAt: isoTime.nullable(),
  /** To the end, or to now while it goes on. */
  durationMinutes: z.number(),
  worst: z
    .object({ value: z.number(), unit: pressureUnitSchema, pressurePa: z.number(), at: isoTime })
    .nullable(),
  critical: z.boolean(),
  acknowledgement: z
    .object({ at: isoTime, byName: responseText().nullable(), note: responseText().nullable() })
    .nullable(),
});
export type PressureAlarmEntry = z.infer<typeof pressureAlarmEntrySchema>;

export const pressureSpaceResponseSchema = z.object({
  space: z.object({
    id: uuidSchema,
    siteId: uuidSchema,
    name: responseText(),
    zoneType: responseText(),
    retired: z.boolean(),
    /** Whether a monitor may be mapped to this kind of space (isolation rooms). */
    takesMonitor: z.boolean(),
    timeZone: responseText(),
  }),
  /** Null when no monitor is mapped to the room. */
  monitor: pressureMonitorSchema.nullable(),
  live: pressureLiveSchema.nullable(),
  range: z.enum(pressureRanges),
  from: isoTime,
  to: isoTime,
  bucket: z.enum(["minute", "hour"]),
  series: z.array(pressurePointSchema),
  table: z.array(pressureTableRowSchema),
  alarms: z.array(pressureAlarmEntrySchema),
  /** How many alarms the range holds (the list shows the latest `maxListedAlarms`). */
  alarmCount: z.number().int(),
});
export type PressureSpaceResponse = z.infer<typeof pressureSpaceResponseSchema>;

export const monitorMappingResponseSchema = z.object({ monitor: pressureMonitorSchema });
