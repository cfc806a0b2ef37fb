import {
  fromSi,
  type Quantity,
  type ReadingUnit,
  storedUnitOf,
  toSi,
  unitsForQuantity,
} from "@shared/calc/answer-rules";

export type { Quantity };

export interface UnitChoice {
  unit: ReadingUnit;
  /** Spoken in full: for the unit select. */
  label: string;
  /** Written after a number. */
  symbol: string;
  /** Decimal places worth showing for a site reading in this unit. */
  decimals: number;
}

const units: Record<ReadingUnit, UnitChoice> = {
  Pa: { unit: "Pa", label: "Pa", symbol: "Pa", decimals: 1 },
  inH2O: { unit: "inH2O", label: "inches of water", symbol: "in. w.c.", decimals: 3 },
  "m3/h": { unit: "m3/h", label: "m³/h", symbol: "m³/h", decimals: 0 },
  cfm: { unit: "cfm", label: "cfm", symbol: "cfm", decimals: 0 },
  percent: { unit: "percent", label: "percent", symbol: "%", decimals: 1 },
  ach: { unit: "ach", label: "air changes per hour", symbol: "ACH", decimals: 1 },
  min: { unit: "min", label: "minutes", symbol: "min", decimals: 0 },
};

/** The units an auditor may read each quantity in (the shared rules); the first is the stored one. */
const choicesOf = (quantity: Quantity) => unitsForQuantity[quantity].map((unit) => units[unit]);
export const unitsByQuantity: Record<Quantity, readonly UnitChoice[]> = {
  pressure: choicesOf("pressure"),
  airflow: choicesOf("airflow"),
  air_changes: choicesOf("air_changes"),
  percent: choicesOf("percent"),
  minutes: choicesOf("minutes"),
};

export function defaultUnit(quantity: Quantity): ReadingUnit {
  return storedUnitOf(quantity);
}

/** A value as read in `unit` → the stored unit (Pa, m³/h; the others are stored as read). */
export const toStoredUnit = toSi;

/** A stored value → the unit the auditor chose, to show it the way it was read. */
export const fromStoredUnit = fromSi;

function trimZeros(text: string): string {
  return text.includes(".") ? text.replace(/\.?0+$/, "") : text;
}

/** "−2.5 Pa", "−0.010 in. w.c.", "450 m³/h": a real minus sign, no needless trailing zeros. */
export function formatReading(value: number, unit: ReadingUnit, decimals?: number): string {
  const choice = units[unit];
  const places = decimals ?? choice.decimals;
  let digits = value.toFixed(places);
  // Pressures in inches of water are small; keep the places so 0.010 does not read as 0.01.
  if (unit !== "inH2O") digits = trimZeros(digits);
  if (/^-0(\.0*)?$/.test(digits)) digits = digits.slice(1);
  const signed = digits.startsWith("-") ? `\u2212${digits.slice(1)}` : digits;
  return unit === "percent" ? `${signed}%` : `${signed} ${choice.symbol}`;
}

/** The same stored value in every unit of its quantity except `shownIn`, e.g. "= −0.010 in. w.c.". */
export function otherUnits(
  storedValue: number,
  quantity: Quantity,
  shownIn: ReadingUnit,
): string[] {
  return unitsByQuantity[quantity]
    .filter((choice) => choice.unit !== shownIn)
    .map((choice) => formatReading(fromStoredUnit(storedValue, choice.unit), choice.unit));
}
