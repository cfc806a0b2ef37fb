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

/** A refused reading's problems, one a field, named by `fieldName` (a CSV column, a JSON key). */
export function problemsOf(
  error: z.ZodError,
  fieldName: (key: string) => string,
): ReadingProblem[] {
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
