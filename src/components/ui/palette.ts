/**
 * Lintel's one palette for marks: severities, verdicts, action states and chart marks. Tailwind
 * (`tailwind.config.ts`), the map pins and the charts all read these values, so a colour means the
 * same thing everywhere. Every colour meets WCAG 2.1 AA where it is used (see
 * `tests/client/palette-contrast.test.ts`), and no meaning rests on colour alone: each mark also
 * has its own shape and its words.
 */

/** The grounds marks are drawn on. */
export const grounds = {
  white: "#ffffff",
  sunken: "#f3f5f6",
  brandTint: "#eef6f6",
  clayTint: "#fbf4ef",
} as const;

/** Severity of a checklist item or corrective action; the trade's own three words. */
export const severityPalette = {
  critical: "#a3212b",
  major: "#8a5a00",
  minor: "#1d5e73",
} as const;

/** What an audit says about a space, keyed by meaning. */
export const verdictMeanings = ["all_clear", "gaps_to_fix", "hold"] as const;
export type VerdictMeaning = (typeof verdictMeanings)[number];

/** A hold shares critical's colour and gaps share major's: the same kind of failure, one colour. */
export const verdictPalette: Record<VerdictMeaning, string> = {
  all_clear: "#1d6b3a",
  gaps_to_fix: severityPalette.major,
  hold: severityPalette.critical,
};

/** Where a corrective action stands, keyed by meaning. */
export const actionStateMeanings = ["to_fix", "fixing", "to_check", "done"] as const;
export type ActionStateMeaning = (typeof actionStateMeanings)[number];

export const actionStatePalette: Record<ActionStateMeaning, string> = {
  to_fix: "#163b3d",
  fixing: "#8a5a00",
  to_check: "#1d5e73",
  done: "#1d6b3a",
};

/** Colours the charts draw with (SVG attributes cannot take Tailwind classes). */
export const chartPalette = {
  value: "#1a4a4d",
  flagged: "#9a4f22",
  reference: "#4a5866",
  grid: "#d7dde2",
  ink: "#17212b",
} as const;

/** A past-due action: critical's colour, with its own clock shape and the word "Overdue". */
export const overdueColour = severityPalette.critical;

/** Tint behind a badge's words: the mark's colour at this opacity over white. */
export const badgeTintOpacity = 0.1;
