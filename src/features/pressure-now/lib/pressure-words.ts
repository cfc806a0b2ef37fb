import {
  type PressureOpenAlarm,
  type PressureRoomNow,
  type PressureRoomState,
  pressureRoomStateLabels,
} from "@shared/schemas/pressure-site";

/** A differential with its sign, as monitors show it: "+1.2 Pa", "−3.0 Pa", "−0.012 in. w.c.". */
export function formatPressure(value: number, unit: "Pa" | "inH2O"): string {
  const digits = unit === "Pa" ? 1 : 3;
  const figure = Math.abs(value).toFixed(digits);
  const sign = value > 0 ? "+" : value < 0 ? "−" : "";
  return `${sign}${figure} ${unit === "Pa" ? "Pa" : "in. w.c."}`;
}

/** "6 min", "1 h 5 min", "less than a minute". */
export function formatDuration(ms: number): string {
  const minutes = Math.floor(Math.max(0, ms) / 60_000);
  if (minutes < 1) return "less than a minute";
  if (minutes < 60) return `${minutes} min`;
  const hours = Math.floor(minutes / 60);
  const rest = minutes % 60;
  return rest === 0 ? `${hours} h` : `${hours} h ${rest} min`;
}

/** Rooms that need someone now: in excursion, or silent. */
export function needsAttention(state: PressureRoomState): boolean {
  return state === "excursion" || state === "no_readings";
}

/**
 * What an alarm says in one line, e.g. "not negative for 6 min, worst +1.2 Pa" or
 * "no readings for 12 min". Measured to `asOf`, the server's clock when it answered.
 */
export function describeAlarm(alarm: PressureOpenAlarm, asOf: string): string {
  const lasted = formatDuration(Date.parse(asOf) - Date.parse(alarm.since));
  if (alarm.kind === "no_readings") return `no readings for ${lasted}`;
  const worst =
    alarm.worstValue !== null && alarm.worstUnit !== null
      ? `, worst ${formatPressure(alarm.worstValue, alarm.worstUnit)}`
      : "";
  return `not negative for ${lasted}${worst}`;
}

/** The room's state in words, with its newest reading where that helps. */
export function describeRoom(room: PressureRoomNow, asOf: string): string {
  if (room.alarm && needsAttention(room.state)) {
    const words = describeAlarm(room.alarm, asOf);
    return words.charAt(0).toUpperCase() + words.slice(1);
  }
  const label = pressureRoomStateLabels[room.state];
  return room.latest
    ? `${label}, ${formatPressure(room.latest.pressure, room.latest.unit)}`
    : label;
}
