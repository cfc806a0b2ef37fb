import { pascalsToInchesOfWater } from "@shared/calc/ventilation";
import type { PressureUnit } from "@shared/schemas/pressure-readings";
import type { PressureState } from "@shared/schemas/pressure-space";

/** A value in Pa shown in the monitor's unit: one decimal in Pa, three in inches of water. */
export function inUnit(pascals: number, unit: PressureUnit): number {
  return unit === "Pa" ? pascals : pascalsToInchesOfWater(pascals);
}

export const unitWords: Record<PressureUnit, string> = { Pa: "Pa", inH2O: "in. w.c." };

/** A figure as sent or converted, with its unit and a true minus sign. */
export function formatPressure(value: number, unit: PressureUnit): string {
  const digits = unit === "Pa" ? 1 : 3;
  const text = Math.abs(value).toFixed(digits);
  const sign = value < 0 && Number(text) !== 0 ? "−" : value > 0 ? "+" : "";
  return `${sign}${text} ${unitWords[unit]}`;
}

export function formatPascalsIn(pascals: number, unit: PressureUnit): string {
  return formatPressure(inUnit(pascals, unit), unit);
}

/** The state now in words: a heading and what it means. Never told by colour alone. */
export const stateWords: Record<PressureState, { label: string; meaning: string; mark: string }> = {
  in_range: {
    label: "In range",
    meaning: "Negative to the corridor, meeting the room's threshold.",
    mark: "✓",
  },
  out_of_range: {
    label: "Out of range",
    meaning: "Not negative enough just now; an alarm follows if it lasts past the grace period.",
    mark: "!",
  },
  excursion: {
    label: "Excursion",
    meaning: "Out of range past the grace period: the alarm has been raised.",
    mark: "▲",
  },
  no_readings: {
    label: "No readings",
    meaning: "The monitor has not reported for 10 minutes or more.",
    mark: "?",
  },
  never_reported: {
    label: "Never reported",
    meaning: "No reading has arrived from this monitor yet.",
    mark: "–",
  },
};

/** A length of time in words: "45 min", "2 h 5 min". */
export function formatMinutes(minutes: number): string {
  if (minutes < 1) return `${Math.round(minutes * 60)} s`;
  const whole = Math.round(minutes);
  if (whole < 60) return `${whole} min`;
  const hours = Math.floor(whole / 60);
  const rest = whole % 60;
  return rest === 0 ? `${hours} h` : `${hours} h ${rest} min`;
}

/** A moment at the site: "14:05" or "3 Dec 14:05". */
export function formatAt(
  iso: string,
  timeZone: string,
  style: "time" | "day" | "dayTime" = "dayTime",
): string {
  const options: Intl.DateTimeFormatOptions =
    style === "time"
      ? { hour: "2-digit", minute: "2-digit", hourCycle: "h23" }
      : style === "day"
        ? { day: "numeric", month: "short" }
        : { day: "numeric", month: "short", hour: "2-digit", minute: "2-digit", hourCycle: "h23" };
  return new Intl.DateTimeFormat("en-GB", { timeZone, ...options }).format(new Date(iso));
}
