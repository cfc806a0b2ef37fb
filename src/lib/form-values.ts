import { z } from "zod";

/**
 * A number typed into a form field: blank is "no value", a decimal comma counts as a point (as many
 * keyboards type it), anything else that is not a number stays NaN for the schema to refuse.
 */
export function parseNumberText(value: string): number | undefined {
  const trimmed = value.trim();
  if (trimmed === "") return undefined;
  const normalised = trimmed.replace(",", ".");
  return /^[-+]?(\d+\.?\d*|\.\d+)$/.test(normalised) ? Number(normalised) : Number.NaN;
}

/** A text field read as a required number, judged by the contract's own number schema. */
export function numberText<T extends z.ZodType>(target: T) {
  // The target is a number schema; zod cannot see that its input accepts what the transform gives.
  return z
    .string()
    .transform(parseNumberText)
    .pipe(target as unknown as z.ZodType<z.output<T>, number | undefined>);
}

/** A text field read as an optional number: blank becomes null, as the contract expects. */
export function optionalNumberText<T extends z.ZodType>(target: T) {
  return z
    .string()
    .transform((value) => parseNumberText(value) ?? null)
    .pipe(target as unknown as z.ZodType<z.output<T>, number | null>);
}
