/**
 * The answer rules, written once for the phone and the server: which units a reading may be
 * entered in, what is a plausible reading, how it converts to the stored SI unit, and whether a
 * reading or count passes its item's threshold. Pure functions: no I/O, no dates.
 */
import {
  cfmToCubicMetresPerHour,
  cubicMetresPerCubicFoot,
  inchesOfWaterToPascals,
  minimumNegativePressurePascals,
  negativePressureInchesOfWater,
  pascalsToInchesOfWater,
} from "./ventilation";

export const quantities = ["pressure", "airflow", "air_changes", "percent", "minutes"] as const;
export type Quantity = (typeof quantities)[number];

/** Units an auditor may enter a reading in; the server stores SI (Pa, m³/h) beside the entry. */
export const readingUnits = ["Pa", "inH2O", "m3/h", "cfm", "percent", "ach", "min"] as const;
export type ReadingUnit = (typeof readingUnits)[number];

export type AnswerOutcome = "pass" | "fail" | "not_applicable";

export interface Threshold {
  op: ">=" | "<=";
  /** In the stored (SI) unit: Pa, m³/h, ACH, percent, minutes. */
  value: number;
}

/** The units each quantity may be read in; the first is the stored (SI) one. */
export const unitsForQuantity: Record<Quantity, readonly ReadingUnit[]> = {
  pressure: ["Pa", "inH2O"],
  airflow: ["m3/h", "cfm"],
  air_changes: ["ach"],
  percent: ["percent"],
  minutes: ["min"],
};

export function storedUnitOf(quantity: Quantity): ReadingUnit {
  return unitsForQuantity[quantity][0]!;
}

/** Plausible ranges in SI, beyond which a reading is a typing slip rather than a measurement. */
export const plausibleRanges: Record<Quantity, { min: number; max: number; message: string }> = {
  pressure: {
    min: -100,
    max: 100,
    message: "A pressure differential beyond ±100 Pa is not a plausible room reading.",
  },
  airflow: { min: 0, max: 100_000, message: "Airflow must be between 0 and 100,000 m³/h." },
  air_changes: { min: 0, max: 200, message: "Air changes per hour must be between 0 and 200." },
  percent: { min: 0, max: 100, message: "A percentage is between 0 and 100." },
  minutes: { min: 0, max: 10_000, message: "Minutes must be between 0 and 10,000." },
};

/** A value as read in `unit` → the stored unit (Pa, m³/h; the others are stored as read). */
export function toSi(value: number, unit: ReadingUnit): number {
  if (unit === "inH2O") return inchesOfWaterToPascals(value);
  if (unit === "cfm") return cfmToCubicMetresPerHour(value);
  return value;
}

/** A stored value → the unit the auditor chose. */
export function fromSi(value: number, unit: ReadingUnit): number {
  if (unit === "inH2O") return pascalsToInchesOfWater(value);
  if (unit === "cfm") return value / (cubicMetresPerCubicFoot * 60);
  return value;
}

// Readings land a hair either side of a limit through float arithmetic; that is not a fail.
const relativeTolerance = 1e-9;

/** Whether `value` meets the threshold `op figure`, with a tiny relative tolerance for float noise. */
export function meetsFigure(value: number, op: Threshold["op"], figure: number): boolean {
  const slack = relativeTolerance * Math.max(1, Math.abs(figure));
  return op === ">=" ? value >= figure - slack : value <= figure + slack;
}

/** A threshold in the stored unit, judged against a stored value. */
export function meetsThreshold(storedValue: number, threshold: Threshold): boolean {
  return meetsFigure(storedValue, threshold.op, threshold.value);
}

/**
 * The pressure figure the source states in `unit`, for a threshold given in Pa. The CDC states the
 * isolation-room differential twice, as 2.5 Pa and as 0.01 in. w.c.; the two differ slightly
 * (0.01 in. w.c. = 2.49 Pa), so each unit is judged against the figure stated in it. Other
 * thresholds are converted.
 */
export function pressureFigureIn(unit: "Pa" | "inH2O", thresholdPascals: number): number {
  if (unit === "Pa") return thresholdPascals;
  if (Math.abs(Math.abs(thresholdPascals) - minimumNegativePressurePascals) < 1e-12) {
    return Math.sign(thresholdPascals) * negativePressureInchesOfWater;
  }
  return pascalsToInchesOfWater(thresholdPascals);
}

/**
 * Whether a pressure reading, as entered in its unit (negative for a room below the corridor),
 * meets a threshold given in Pa: it meets the source's figure in the unit it was entered in.
 * −0.010 in. w.c. and −2.5 Pa both meet "≤ −2.5 Pa"; −2.4 Pa does not.
 */
export function meetsPressureThreshold(
  value: number,
  unit: "Pa" | "inH2O",
  threshold: Threshold,
): boolean {
  if (!Number.isFinite(value)) return false;
  return meetsFigure(value, threshold.op, pressureFigureIn(unit, threshold.value));
}

/** What an item needs to be judged: a subset of a checklist item. */
export interface RuledItem {
  response: "check" | "reading" | "count" | "choice";
  quantity?: Quantity | null;
  threshold?: Threshold | null;
  choices?: readonly { value: string; passes: boolean }[] | null;
}

/** What the room contributes: the air-change minimum for its construction class. */
export interface RuledRoom {
  minimumAirChanges: number | null;
}

/**
 * The limit a reading or count is judged against. An air-change reading without a limit of its own
 * takes the one for the room's construction class.
 */
export function thresholdFor(item: RuledItem, room: RuledRoom | null): Threshold | null {
  if (item.threshold) return item.threshold;
  if (item.response === "reading" && item.quantity === "air_changes" && room?.minimumAirChanges) {
    return { op: ">=", value: room.minimumAirChanges };
  }
  return null;
}

/** Whether a reading, entered as `value` in `unit`, meets the threshold (pressure: at the source's figure). */
export function readingMeets(
  quantity: Quantity,
  value: number,
  unit: ReadingUnit,
  threshold: Threshold,
): boolean {
  if (quantity === "pressure" && (unit === "Pa" || unit === "inH2O")) {
    return meetsPressureThreshold(value, unit, threshold);
  }
  return meetsThreshold(toSi(value, unit), threshold);
}

/** What an auditor sends for one item. */
export interface AnswerEntry {
  outcome: AnswerOutcome | null;
  value?: number | null;
  unit?: ReadingUnit | null;
  count?: number | null;
  choice?: string | null;
  note?: string | null;
}

/** What is stored for an answer: the reading as entered, its SI value and the decided outcome. */
export interface DecidedAnswer {
  outcome: AnswerOutcome | null;
  /** SI value. */
  value: number | null;
  /** The value as the auditor entered it, in `unit`. */
  enteredValue: number | null;
  unit: ReadingUnit | null;
  count: number | null;
  choice: string | null;
  note: string | null;
}

/** A rule refusing an answer, naming the field at fault. */
export class AnswerRefusal extends Error {
  constructor(
    readonly field: "value" | "unit" | "count" | "choice",
    message: string,
  ) {
    super(message);
    this.name = "AnswerRefusal";
  }
}

/**
 * Decides what to store for an answer: a reading is checked for unit and plausibility, kept as
 * entered and in SI, and passed or failed by the item's threshold where it has one (the auditor
 * may still mark the item not applicable). Throws AnswerRefusal naming the field when refused.
 */
export function decideAnswer(
  item: RuledItem,
  entry: AnswerEntry,
  room: RuledRoom | null,
): DecidedAnswer {
  const base: DecidedAnswer = {
    outcome: entry.outcome,
    value: null,
    enteredValue: null,
    unit: null,
    count: null,
    choice: null,
    note: entry.note ?? null,
  };
  if (entry.outcome === "not_applicable" || entry.outcome === null) return base;

  switch (item.response) {
    case "check":
      return base;
    case "reading": {
      if (entry.value === undefined || entry.value === null)
        throw new AnswerRefusal("value", "Enter the reading.");
      const quantity = item.quantity ?? "pressure";
      const allowed = unitsForQuantity[quantity];
      const unit = entry.unit ?? allowed[0]!;
      if (!allowed.includes(unit))
        throw new AnswerRefusal("unit", `Use ${allowed.join(" or ")} for this reading.`);
      const range = plausibleRanges[quantity];
      if (!Number.isFinite(entry.value)) throw new AnswerRefusal("value", range.message);
      const value = toSi(entry.value, unit);
      if (!Number.isFinite(value) || value < range.min || value > range.max)
        throw new AnswerRefusal("value", range.message);
      const threshold = thresholdFor(item, room);
      const outcome = threshold
        ? readingMeets(quantity, entry.value, unit, threshold)
          ? "pass"
          : "fail"
        : entry.outcome;
      return { ...base, outcome, value, enteredValue: entry.value, unit };
    }
    case "count": {
      if (entry.count === undefined || entry.count === null)
        throw new AnswerRefusal("count", "Enter the count.");
      const outcome = item.threshold
        ? meetsThreshold(entry.count, item.threshold)
          ? "pass"
          : "fail"
        : entry.outcome;
      return { ...base, outcome, count: entry.count };
    }
    case "choice": {
      const choice = item.choices?.find((option) => option.value === entry.choice);
      if (!choice) throw new AnswerRefusal("choice", "Choose one of the options.");
      return { ...base, outcome: choice.passes ? "pass" : "fail", choice: choice.value };
    }
  }
}

/**
 * Pass or fail from an entry while the auditor types; null while there is nothing to judge yet
 * (no value, no limit, or a value the rules refuse).
 */
export function outcomeOfEntry(
  item: RuledItem,
  entry: AnswerEntry,
  room: RuledRoom | null,
): "pass" | "fail" | null {
  if (item.response === "choice") {
    const picked = item.choices?.find((choice) => choice.value === entry.choice);
    return picked ? (picked.passes ? "pass" : "fail") : null;
  }
  const threshold = thresholdFor(item, room);
  if (!threshold) return null;
  if (item.response === "reading") {
    if (entry.value === null || entry.value === undefined || !entry.unit) return null;
    if (!Number.isFinite(entry.value)) return null;
    return readingMeets(item.quantity ?? "pressure", entry.value, entry.unit, threshold)
      ? "pass"
      : "fail";
  }
  if (item.response === "count") {
    if (entry.count === null || entry.count === undefined) return null;
    return meetsThreshold(entry.count, threshold) ? "pass" : "fail";
  }
  return null;
}
