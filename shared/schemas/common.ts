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

const knownTimeZones = new Set<string>([...Intl.supportedValuesOf("timeZone"), "UTC"]);

/** An IANA time zone name such as `Europe/Dublin`; abbreviations and offsets are refused. */
export const timeZoneSchema = text()
  .trim()
  .max(64, { message: "At most 64 characters." })
  .refine((value) => knownTimeZones.has(value), {
    message: "Use an IANA time zone name such as Europe/Dublin.",
  });

export function isKnownTimeZone(value: string): boolean {
  return knownTimeZones.has(value);
}
