import { z } from "zod";

import { zoneTypes } from "../zones";
import { responseText, text, uuidSchema } from "./common";
import { pressureUnits } from "./pressure-readings";

/**
 * Live room pressure where people already look: each monitored room's state now at a site, the
 * acknowledgement of an alarm, and the last 24 hours beside an audit's pressure item.
 */

/**
 * A room's state now.
 * - `excursion`: an out-of-range alarm is open (past its grace).
 * - `no_readings`: a no-readings alarm is open, or the monitor has been silent past the limit.
 * - `out_of_range`: the latest reading misses the threshold, still within the grace.
 * - `in_range`: the latest reading meets the threshold.
 * - `never_reported`: the monitor is mapped but has sent nothing yet.
 */
export const pressureRoomStates = [
  "excursion",
  "no_readings",
  "out_of_range",
  "in_range",
  "never_reported",
] as const;
export type PressureRoomState = (typeof pressureRoomStates)[number];

export const pressureRoomStateLabels: Record<PressureRoomState, string> = {
  excursion: "Not negative",
  no_readings: "No readings",
  out_of_range: "Out of range, within grace",
  in_range: "Negative",
  never_reported: "Never reported",
};

const isoTime = () => z.iso.datetime({ offset: true });

export const pressureLatestReadingSchema = z.object({
  measuredAt: isoTime(),
  pressure: z.number(),
  unit: z.enum(pressureUnits),
  pressurePa: z.number(),
  door: z.enum(["open", "closed"]).nullable(),
});
export type PressureLatestReading = z.infer<typeof pressureLatestReadingSchema>;

export const pressureOpenAlarmSchema = z.object({
  id: uuidSchema,
  kind: z.enum(["out_of_range", "no_readings"]),
  /** The first reading out of range, or the last reading before the silence. */
  since: isoTime(),
  alarmAt: isoTime(),
  worstValue: z.number().nullable(),
  worstUnit: z.enum(pressureUnits).nullable(),
  worstPa: z.number().nullable(),
  critical: z.boolean(),
  acknowledgedAt: isoTime().nullable(),
  acknowledgedByName: responseText().nullable(),
  acknowledgementNote: responseText().nullable(),
});
export type PressureOpenAlarm = z.infer<typeof pressureOpenAlarmSchema>;

export const pressureRoomNowSchema = z.object({
  spaceId: uuidSchema,
  spaceName: responseText(),
  zoneType: z.enum(zoneTypes),
  floorId: uuidSchema,
  floorName: responseText(),
  monitorId: responseText(),
  /** The room's threshold in Pa (its own, or Lintel's default). */
  thresholdPa: z.number(),
  state: z.enum(pressureRoomStates),
  latest: pressureLatestReadingSchema.nullable(),
  /** The open alarm that decides the state (an excursion before a silence), if any. */
  alarm: pressureOpenAlarmSchema.nullable(),
});
export type PressureRoomNow = z.infer<typeof pressureRoomNowSchema>;

export const pressureNowResponseSchema = z.object({
  siteId: uuidSchema,
  siteName: responseText(),
  /** The server's clock when the answer was made, for "for 6 min" on the phone. */
  asOf: isoTime(),
  rooms: z.array(pressureRoomNowSchema),
});
export type PressureNowResponse = z.infer<typeof pressureNowResponseSchema>;

export const pressureAlarmParamsSchema = z.strictObject({ alarmId: uuidSchema });

export const maxAcknowledgementNoteLength = 500;

export const acknowledgeAlarmBodySchema = z.strictObject({
  note: text()
    .trim()
    .min(1, { message: "Say what was done or seen: a note is required." })
    .max(maxAcknowledgementNoteLength, {
      message: `At most ${maxAcknowledgementNoteLength} characters.`,
    }),
});
export type AcknowledgeAlarmBody = z.infer<typeof acknowledgeAlarmBodySchema>;

export const acknowledgeAlarmResponseSchema = z.object({ alarm: pressureOpenAlarmSchema });

/** The last 24 hours of one room, a point per minute with readings (from the minute roll-up). */
export const pressure24hResponseSchema = z.object({
  spaceId: uuidSchema,
  /** Null when no monitor is mapped to the room. */
  monitorId: responseText().nullable(),
  thresholdPa: z.number(),
  from: isoTime(),
  to: isoTime(),
  points: z.array(
    z.object({ at: isoTime(), meanPa: z.number(), minPa: z.number(), maxPa: z.number() }),
  ),
  summary: z
    .object({
      minPa: z.number(),
      meanPa: z.number(),
      maxPa: z.number(),
      /** Monitored minutes, and those whose mean missed the threshold. */
      minutes: z.number().int(),
      minutesOutOfRange: z.number().int(),
    })
    .nullable(),
});
export type Pressure24hResponse = z.infer<typeof pressure24hResponseSchema>;
