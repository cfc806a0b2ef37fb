import { z } from "zod";

export const uuidSchema = z.uuid({ message: "Must be a valid id." });

/** Messages that tell a missing value from a value of the wrong type. */
const typeMessage = (kind: string) => (issue: { input?: unknown }) =>
  issue.input === undefined ? "Required." : `Must be ${kind}.`;

export const text = () => z.string({ error: typeMessage("text") });
export const numberInput = () => z.number({ error: typeMessage("a number") });

/** A required single-line text: trimmed, not empty, bounded. */
export function requiredText(max: number) {
  return text()
    .trim()
    .min(1, { message: "Required." })
    .max(max, { message: `At most ${max} characters.` });
}

export const emailSchema = text()
  .trim()
  .toLowerCase()
  .max(254, { message: "At most 254 characters." })
  .pipe(z.email({ message: "Enter an e-mail address such as name@example.org." }));

/** Area/Location names (and UTC); the runtime's time-zone database decides whether one exists. */
const ianaShape = /^(?:UTC|[A-Za-z]+(?:\/[A-Za-z0-9_+-]+)+)$/;

export function isKnownTimeZone(value: string): boolean {
  if (!ianaShape.test(value)) return false;
  try {
    new Intl.DateTimeFormat("en-GB", { timeZone: value });
    return true;
  } catch {
    return false;
  }
}

/** An IANA time zone name such as `Europe/Dublin`; abbreviations and offsets are refused. */
export const timeZoneSchema = text()
  .trim()
  .max(64, { message: "At most 64 characters." })
  .refine(isKnownTimeZone, { message: "Use an IANA time zone name such as Europe/Dublin." });
