import { parse as parseCsv } from "csv-parse/sync";
import { z } from "zod";

import { plausibleRanges, toSi } from "../calc/answer-rules";

import { numberInput, text } from "./common";

/**
 * A room-pressure monitor's reading as it reaches Lintel: from the monitor's own topic on an MQTT
 * broker (one JSON message a reading) or in a batch uploaded over HTTP (JSON or CSV). The same
 * field rules apply to every path; only the envelope differs.
 */

/** The units a monitor may report in: the audits' pressure units (answer-rules.ts). */
export const pressureUnits = ["Pa", "inH2O"] as const;
export type PressureUnit = (typeof pressureUnits)[number];

export const doorStates = ["open", "closed"] as const;
export type DoorState = (typeof doorStates)[number];

/** One reading, parsed: the time as a Date, the differential as the monitor sent it. */
export interface PressureReading {
  monitorId: string;
  measuredAt: Date;
  /** The differential to the corridor as sent, in `unit`; negative for a room below the corridor. */
  pressure: number;
  unit: PressureUnit;
  /** The door as the monitor reports it; null when the monitor has no door contact. */
  door: DoorState | null;
}

/** The differential in Pa, Lintel's stored unit. */
export function pressureInPascals(reading: Pick<PressureReading, "pressure" | "unit">): number {
  return toSi(reading.pressure, reading.unit);
}

/** Most readings a batch may carry (JSON or CSV); a larger upload is split by the sender. */
export const maxBatchReadings = 10_000;

/** How far ahead of Lintel's clock a reading may be dated: a monitor's clock drifts a little. */
export const maxClockSkewMs = 60_000;

/** Readings before this are from a monitor whose clock was never set. */
const earliestReading = Date.UTC(2000, 0, 1);

const monitorIdShape = /^[A-Za-z0-9][A-Za-z0-9._:-]*$/;
const monitorIdMessage =
  "Use up to 64 letters, digits, dots, dashes, underscores or colons, starting with a letter or digit.";

/** A monitor's id as the building names it; it is one level of an MQTT topic, so no `/`, `+` or `#`. */
export const monitorIdSchema = text()
  .trim()
  .min(1, { message: "Required." })
  .max(64, { message: monitorIdMessage })
  .regex(monitorIdShape, { message: monitorIdMessage });

// Spellings building systems use for the two units; matched without case or spaces.
const unitSpellings: Record<string, PressureUnit> = {
  pa: "Pa",
  inh2o: "inH2O",
  "in.w.c.": "inH2O",
  inwc: "inH2O",
};

const unitMessage = "Use Pa or inH2O (in. w.c.).";

export const pressureUnitSchema = text().transform((value, ctx) => {
  const unit = unitSpellings[value.replace(/\s+/g, "").toLowerCase()];
  if (unit) return unit;
  ctx.addIssue({ code: "custom", message: unitMessage });
  return z.NEVER;
});

const doorMessage =
  "Use open or closed, or leave the door out when the monitor has no door contact.";

export const doorStateSchema = text()
  .transform((value, ctx) => {
    const door = value.trim().toLowerCase();
    if (door === "open" || door === "closed") return door;
    ctx.addIssue({ code: "custom", message: doorMessage });
    return z.NEVER;
  })
  .nullish()
  .transform((door) => door ?? null);

export const measuredAtSchema = z.iso
  .datetime({
    offset: true,
    message: "Use an ISO 8601 date and time with its offset, such as 2026-12-03T10:14:05Z.",
  })
  .transform((value) => new Date(value))
  .refine((date) => date.getTime() >= earliestReading, {
    message: "Dated before 2000: the monitor's clock looks unset.",
  });

const pressureMessage = plausibleRanges.pressure.message;

const readingFields = {
  measuredAt: measuredAtSchema,
  pressure: numberInput(),
  unit: pressureUnitSchema,
  door: doorStateSchema,
};

/** A plausible room differential: within ±100 Pa once converted (the audits' plausible range). */
function checkPlausible(
  reading: { pressure: number; unit: PressureUnit },
  ctx: z.RefinementCtx,
): void {
  const pascals = pressureInPascals(reading);
  const { min, max } = plausibleRanges.pressure;
  if (!(pascals >= min && pascals <= max))
    ctx.addIssue({ code: "custom", path: ["pressure"], message: pressureMessage });
}

/** One reading in a JSON batch: every field named, nothing unknown. */
export const pressureReadingSchema = z
  .strictObject({ monitorId: monitorIdSchema, ...readingFields })
  .superRefine(checkPlausible);

/** A JSON batch upload: `{ "readings": [ … ] }`. */
export const pressureReadingBatchSchema = z.strictObject({
  readings: z
    .array(pressureReadingSchema, { error: "Send a list of readings." })
    .min(1, { message: "Send at least one reading." })
    .max(maxBatchReadings, {
      message: `At most ${maxBatchReadings.toLocaleString("en-US")} readings in one upload.`,
    }),
});
export type PressureReadingBatch = z.infer<typeof pressureReadingBatchSchema>;

/**
 * One MQTT message's payload. The monitor is the topic's; an id in the payload must agree with it.
 * Fields a gateway adds of its own (signal strength, battery) are ignored, not refused.
 */
export const pressureMessagePayloadSchema = z
  .object({ monitorId: monitorIdSchema.optional(), ...readingFields })
  .superRefine(checkPlausible);

// ---------------------------------------------------------------------------------------------
// Topics

/** Where monitors publish: `lintel/pressure/<monitor id>`, one topic per monitor. */
export const defaultPressureTopicPrefix = "lintel/pressure";

function assertTopicPrefix(prefix: string): void {
  if (prefix === "" || /[+#]/.test(prefix) || prefix.startsWith("/") || prefix.endsWith("/"))
    throw new RangeError(
      "A topic prefix has no wildcards and no leading or trailing slash, e.g. lintel/pressure.",
    );
}

/** The topic a monitor publishes on. Throws for an id that cannot be one topic level. */
export function pressureTopic(monitorId: string, prefix = defaultPressureTopicPrefix): string {
  assertTopicPrefix(prefix);
  if (!monitorIdSchema.safeParse(monitorId).success || monitorId.trim() !== monitorId)
    throw new RangeError(`Monitor id "${monitorId}": ${monitorIdMessage}`);
  return `${prefix}/${monitorId}`;
}

/** The subscription that receives every monitor's topic. */
export function pressureTopicFilter(prefix = defaultPressureTopicPrefix): string {
  assertTopicPrefix(prefix);
  return `${prefix}/+`;
}

/** The monitor id a topic names, or null for a topic that is not a monitor's. */
export function monitorIdFromTopic(
  topic: string,
  prefix = defaultPressureTopicPrefix,
): string | null {
  assertTopicPrefix(prefix);
  if (!topic.startsWith(`${prefix}/`)) return null;
  const rest = topic.slice(prefix.length + 1);
  const parsed = monitorIdSchema.safeParse(rest);
  return parsed.success && parsed.data === rest ? rest : null;
}

// ---------------------------------------------------------------------------------------------
// Parsing what arrives

/** What is wrong with a message or a row, naming the field (or `topic`, `payload`, `file`). */
export interface ReadingProblem {
  field: string;
  message: string;
}

export type ParsedMessage =
  { ok: true; reading: PressureReading } | { ok: false; problems: ReadingProblem[] };

/** A message larger than this is not a reading. */
export const maxMessageBytes = 4096;

function problemsOf(error: z.ZodError, fieldName: (key: string) => string): ReadingProblem[] {
  const seen = new Map<string, string>();
  for (const issue of error.issues) {
    const key =
      issue.code === "unrecognized_keys" ? issue.keys.join(", ") : String(issue.path[0] ?? "");
    const field = fieldName(key);
    const message = issue.code === "unrecognized_keys" ? "Unknown field." : issue.message;
    if (!seen.has(field)) seen.set(field, message);
  }
  return [...seen].map(([field, message]) => ({ field, message }));
}

/** Parses one MQTT message: the topic names the monitor, the payload is one JSON reading. */
export function parsePressureMessage(
  topic: string,
  payload: Uint8Array | string,
  prefix = defaultPressureTopicPrefix,
): ParsedMessage {
  const monitorId = monitorIdFromTopic(topic, prefix);
  if (monitorId === null)
    return {
      ok: false,
      problems: [{ field: "topic", message: `Not a monitor's topic: use ${prefix}/<monitor id>.` }],
    };
  const size =
    typeof payload === "string" ? new TextEncoder().encode(payload).length : payload.length;
  if (size > maxMessageBytes)
    return {
      ok: false,
      problems: [{ field: "payload", message: `Larger than ${maxMessageBytes} bytes.` }],
    };
  let json: unknown;
  try {
    const body =
      typeof payload === "string"
        ? payload
        : new TextDecoder("utf-8", { fatal: true }).decode(payload);
    json = JSON.parse(body);
  } catch {
    return { ok: false, problems: [{ field: "payload", message: "Not a JSON reading." }] };
  }
  if (json === null || typeof json !== "object" || Array.isArray(json))
    return {
      ok: false,
      problems: [{ field: "payload", message: "Send one reading as a JSON object." }],
    };
  const parsed = pressureMessagePayloadSchema.safeParse(json);
  if (!parsed.success)
    return { ok: false, problems: problemsOf(parsed.error, (key) => key || "payload") };
  const { monitorId: named, ...fields } = parsed.data;
  if (named !== undefined && named !== monitorId)
    return {
      ok: false,
      problems: [
        {
          field: "monitorId",
          message: `The payload names ${named} but came on ${monitorId}'s topic.`,
        },
      ],
    };
  return { ok: true, reading: { monitorId, ...fields } };
}

/** Whether a reading is dated too far ahead of Lintel's clock to be stored; null when it is not. */
export function futureReadingProblem(measuredAt: Date, now: Date): ReadingProblem | null {
  if (measuredAt.getTime() - now.getTime() <= maxClockSkewMs) return null;
  return {
    field: "measuredAt",
    message: "Dated more than a minute ahead of Lintel's clock: check the monitor's clock.",
  };
}

// ---------------------------------------------------------------------------------------------
// CSV batches

/** The CSV columns, in this order in the template; the header may spell them monitorId etc. */
export const csvColumns = ["monitor_id", "measured_at", "pressure", "unit", "door"] as const;
type CsvColumn = (typeof csvColumns)[number];
const requiredCsvColumns: readonly CsvColumn[] = ["monitor_id", "measured_at", "pressure", "unit"];

const fieldOfColumn: Record<CsvColumn, keyof z.input<typeof pressureReadingSchema>> = {
  monitor_id: "monitorId",
  measured_at: "measuredAt",
  pressure: "pressure",
  unit: "unit",
  door: "door",
};
const columnOfField = Object.fromEntries(
  Object.entries(fieldOfColumn).map(([column, field]) => [field, column]),
) as Record<string, CsvColumn>;

/** A bad CSV row: its line in the file (1 = the header) and the column at fault. */
export interface CsvRowProblem extends ReadingProblem {
  line: number;
}

export interface CsvBatch {
  readings: PressureReading[];
  problems: CsvRowProblem[];
}

const headerKey = (cell: string) =>
  cell
    .trim()
    .toLowerCase()
    .replace(/[\s_-]/g, "");
const columnByHeaderKey = new Map(csvColumns.map((column) => [headerKey(column), column]));

const decimalComma = Symbol("decimal comma");

// A decimal number as a spreadsheet writes it, with a point: -3.1, .5, 1e-2.
const decimal = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

function cellValue(column: CsvColumn, cell: string): unknown {
  const value = cell.trim();
  if (column === "door") return value === "" ? null : value;
  if (column === "pressure") {
    if (value === "") return undefined;
    if (decimal.test(value)) return Number(value);
    return /^[+-]?\d+,\d+$/.test(value) ? decimalComma : value;
  }
  return value === "" ? undefined : value;
}

/**
 * Parses a CSV batch: a header row naming the columns (monitor_id, measured_at, pressure, unit,
 * optional door; any order), then one reading a row. Every bad row is reported by its line and
 * column, with the rows that are good; the caller decides whether a batch with problems is kept.
 */
export function parsePressureCsv(csv: string): CsvBatch {
  // One line break, so the parser's line count is the line a person sees in an editor.
  const normalised = csv.replace(/\r\n?/g, "\n");
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parseCsv(normalised, {
      bom: true,
      info: true,
      relax_column_count: true,
      skip_empty_lines: true,
      max_record_size: 10_000,
    }) as unknown as typeof records;
  } catch (error) {
    const line = (error as { lines?: number }).lines ?? 1;
    const reason = error instanceof Error ? error.message.split(":")[0] : "Unreadable CSV";
    return {
      readings: [],
      problems: [{ line, field: "file", message: `Not readable as CSV (${reason}).` }],
    };
  }
  // The line a record starts on: its last line less the line breaks inside quoted cells.
  const startLine = (entry: (typeof records)[number]) =>
    entry.info.lines - entry.record.reduce((sum, cell) => sum + (cell.split("\n").length - 1), 0);

  const [header, ...rows] = records;
  if (!header)
    return { readings: [], problems: [{ line: 1, field: "file", message: "The file is empty." }] };
  const headerLine = startLine(header);
  const problems: CsvRowProblem[] = [];
  const columns: (CsvColumn | null)[] = header.record.map((cell) => {
    const column = columnByHeaderKey.get(headerKey(cell)) ?? null;
    if (column === null)
      problems.push({
        line: headerLine,
        field: cell.trim() || "(blank)",
        message: `Unknown column; use ${csvColumns.join(", ")}.`,
      });
    return column;
  });
  for (const column of requiredCsvColumns) {
    if (!columns.includes(column))
      problems.push({ line: headerLine, field: column, message: "Missing column." });
  }
  for (const column of csvColumns) {
    if (columns.filter((named) => named === column).length > 1)
      problems.push({ line: headerLine, field: column, message: "Named twice in the header." });
  }
  if (problems.length > 0) return { readings: [], problems };
  if (rows.length > maxBatchReadings)
    return {
      readings: [],
      problems: [
        {
          line: startLine(rows[maxBatchReadings]!),
          field: "file",
          message: `At most ${maxBatchReadings.toLocaleString("en-US")} readings in one upload.`,
        },
      ],
    };

  const readings: PressureReading[] = [];
  for (const row of rows) {
    const line = startLine(row);
    if (row.record.length !== columns.length) {
      problems.push({
        line,
        field: "row",
        message: `${row.record.length} cells where the header has ${columns.length}.`,
      });
      continue;
    }
    const input: Record<string, unknown> = {};
    columns.forEach((column, index) => {
      input[fieldOfColumn[column!]] = cellValue(column!, row.record[index]!);
    });
    const parsed = pressureReadingSchema.safeParse(input);
    if (parsed.success) {
      readings.push(parsed.data);
      continue;
    }
    for (const problem of problemsOf(parsed.error, (key) => columnOfField[key] ?? key)) {
      // "-3,1" is a decimal comma, not text: say so rather than "must be a number".
      const message =
        problem.field === "pressure" && input.pressure === decimalComma
          ? "Use a point for decimals, such as -3.1."
          : problem.message;
      problems.push({ line, field: problem.field, message });
    }
  }
  return { readings, problems };
}
