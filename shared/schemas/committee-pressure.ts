import { z } from "zod";

import { zoneTypes } from "../zones";
import { responseText, uuidSchema } from "./common";

/** Excursions are counted per this many monitored hours. */
export const pressureRateBase = 1000;

/**
 * The committee's room-pressure figures, per readable site and month (on the site's own clock).
 *
 * - Monitored hours: the minutes in which a room's monitor sent at least one reading (a row of the
 *   one-minute roll-up), divided by 60, for the monitors mapped to the site's rooms now.
 * - Hours out of range: the time of the room's out-of-range excursions inside the month, from the
 *   first reading out of range (so the grace time counts) to the end of the excursion (or now, for
 *   one still running); an excursion that crosses a month boundary counts in each month for its
 *   own part.
 * - Excursions: out-of-range excursions that started in the month, counted once there.
 * - Rate: excursions per 1,000 monitored hours with the exact (Garwood) Poisson 95% interval of
 *   the count, scaled by the same factor; null when nothing was monitored that month.
 */
export const pressureRoomMonthSchema = z.object({
  spaceId: uuidSchema,
  spaceName: responseText(),
  monitoredHours: z.number(),
  hoursOutOfRange: z.number(),
  excursions: z.number().int(),
});
export type PressureRoomMonth = z.infer<typeof pressureRoomMonthSchema>;

export const pressureRateSchema = z.object({
  rate: z.number(),
  lower: z.number(),
  upper: z.number(),
});
export type PressureRate = z.infer<typeof pressureRateSchema>;

export const pressureSiteMonthSchema = z.object({
  /** "YYYY-MM" on the site's clock. */
  month: responseText(),
  excursions: z.number().int(),
  monitoredHours: z.number(),
  hoursOutOfRange: z.number(),
  rate: pressureRateSchema.nullable(),
  rooms: z.array(pressureRoomMonthSchema),
});
export type PressureSiteMonth = z.infer<typeof pressureSiteMonthSchema>;

export const pressureSiteFiguresSchema = z.object({
  siteId: uuidSchema,
  siteName: responseText(),
  /** Monitors mapped to the site's rooms now (of the zone type asked for); 0 = "no monitors". */
  monitors: z.number().int(),
  /** Every month of the period, oldest first; empty when the site has no monitors. */
  months: z.array(pressureSiteMonthSchema),
});
export type PressureSiteFigures = z.infer<typeof pressureSiteFiguresSchema>;

export const committeePressureResponseSchema = z.object({
  from: responseText(),
  to: responseText(),
  zoneType: z.enum(zoneTypes).nullable(),
  confidence: z.number(),
  per: z.number(),
  sites: z.array(pressureSiteFiguresSchema),
});
export type CommitteePressureResponse = z.infer<typeof committeePressureResponseSchema>;

const oneDecimal = new Intl.NumberFormat("en-GB", {
  minimumFractionDigits: 1,
  maximumFractionDigits: 1,
});

/** Hours as the committee reads them, one decimal: 1234.56 → "1,234.6"; a trace → "< 0.1". */
export function hoursText(hours: number): string {
  if (hours > 0 && hours < 0.05) return "< 0.1";
  return oneDecimal.format(hours);
}

/** A rate or bound: one decimal, or two significant figures below 0.1 (never rounded to 0). */
export function rateNumberText(value: number): string {
  if (value === 0 || value >= 0.1) return oneDecimal.format(value);
  return value.toPrecision(2);
}

/** A rate with its interval in words: "2.1 (0.3 to 7.6)". */
export function rateText(rate: { rate: number; lower: number; upper: number }): string {
  return `${rateNumberText(rate.rate)} (${rateNumberText(rate.lower)} to ${rateNumberText(rate.upper)})`;
}
