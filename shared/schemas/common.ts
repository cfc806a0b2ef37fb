import { z } from "zod";

/** A reference to something Lintel made (a space, a person, an action); people pick these, never type them. */
export const uuidSchema = z.uuid({
  message: "This does not point to anything in Lintel; choose it again from the list.",
});

/**
 * Messages that tell a missing value from a value of the wrong type, and say a limit in words
 * (a check without a message of its own would otherwise read like code, or claim the wrong type).
 */
const typeMessage = (kind: string) => (issue: z.core.$ZodRawIssue) => {
  if (issue.code === "too_big")
    return issue.origin === "string"
      ? `At most ${issue.maximum} characters.`
      : `At most ${issue.maximum}.`;
  if (issue.code === "too_small")
    return issue.origin === "string"
      ? `At least ${issue.minimum} characters.`
      : `At least ${issue.minimum}.`;
  if (issue.code !== "invalid_type") return undefined;
  return issue.input === undefined ? "Required." : `Must be ${kind}.`;
};

/**
 * Characters a text field refuses: control characters other than tab, line feed and carriage
 * return (C0, DEL, C1), half of a surrogate pair, and the noncharacters U+FFFE and U+FFFF.
 * PostgreSQL cannot store U+0000, and the rest are invisible, break lines in exports, or turn
 * into replacement characters on the way to the database.
 */
const refusedCharacter =
  // eslint-disable-next-line no-control-regex
  /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Where the first refused character is, or -1 when the text can be stored as sent. */
export function refusedCharacterIndex(value: string): number {
  return refusedCharacter.exec(value)?.index ?? -1;
}

/**
 * Text from a request: every text input in Lintel starts here (eslint refuses a bare string
 * schema in shared/schemas), so no request can carry a character the database cannot store.
 */
export const text = () =>
  z.string({ error: typeMessage("text") }).superRefine((value, ctx) => {
    const index = refusedCharacterIndex(value);
    if (index >= 0)
      ctx.addIssue({
        code: "custom",
        message: `Remove the invisible or control character at position ${index + 1}; it cannot be stored.`,
      });
  });

/** Text in a response, as Lintel sends it back: not for requests (use `text()` there). */
export const responseText = () => z.string();
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
  .refine(isKnownTimeZone, {
    message: "Use a time zone name such as Europe/Dublin or America/New_York.",
  });
