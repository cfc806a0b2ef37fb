import "./action-pins.css";

import type { Severity } from "@shared/calc/verdict";
import type { ActionSummary } from "@shared/schemas/actions";

import { severityLabels } from "./action-labels";

/**
 * Our own severity shapes on a 24-unit square, readable without colour: a filled diamond for
 * critical, a triangle for major, a ring for minor. The same markup serves map pins and the key.
 */
export const severityGlyphs: Record<Severity, string> = {
  critical: '<path d="M12 2.5 21.5 12 12 21.5 2.5 12Z" fill="currentColor"/>',
  major:
    '<path d="M12 3.5 21 19.5H3Z" fill="currentColor" fill-opacity="0.25" stroke="currentColor" stroke-width="2.4" stroke-linejoin="round"/>',
  minor: '<circle cx="12" cy="12" r="7" fill="none" stroke="currentColor" stroke-width="2.6"/>',
};

/** A small clock: the action is past its due time. */
export const overdueGlyph =
  '<circle cx="12" cy="12" r="8.5" fill="#ffffff" stroke="currentColor" stroke-width="2.4"/><path d="M12 7.5V12l3 2" fill="none" stroke="currentColor" stroke-width="2.4" stroke-linecap="round"/>';

/** A tick: proof is waiting for an auditor to look. */
export const awaitingGlyph =
  '<circle cx="12" cy="12" r="9" fill="currentColor"/><path d="m7.5 12.3 3 3 6-6.3" fill="none" stroke="#ffffff" stroke-width="2.6" stroke-linecap="round" stroke-linejoin="round"/>';

export function glyphSvg(glyph: string, className = ""): string {
  return `<svg viewBox="0 0 24 24" class="${className}" aria-hidden="true" focusable="false">${glyph}</svg>`;
}

function escapeAttribute(value: string): string {
  return value.replaceAll("&", "&amp;").replaceAll('"', "&quot;").replaceAll("<", "&lt;");
}

/** What a pin says to a screen reader and on hover, e.g. "Critical, overdue: Dirty chair — Doffing area". */
export function actionPinTitle(
  action: Pick<ActionSummary, "severity" | "overdue" | "state" | "title" | "spaceName">,
): string {
  const marks = [severityLabels[action.severity]];
  if (action.overdue) marks.push("overdue");
  if (action.state === "to_check") marks.push("fix to check");
  return `${marks.join(", ")}: ${action.title} — ${action.spaceName}`;
}

/** The markup inside a pin; carries the action's id so it can be found on the page. */
export function actionPinHtml(
  action: Pick<ActionSummary, "id" | "severity" | "overdue" | "state">,
): string {
  const classes = [
    "lintel-action-pin",
    `is-${action.severity}`,
    action.overdue ? "is-overdue" : "",
    action.state === "to_check" ? "is-awaiting" : "",
  ]
    .filter(Boolean)
    .join(" ");
  const marks = [
    action.overdue ? glyphSvg(overdueGlyph, "lintel-action-pin-clock") : "",
    action.state === "to_check" ? glyphSvg(awaitingGlyph, "lintel-action-pin-tick") : "",
  ].join("");
  return `<span class="${classes}" data-action-id="${escapeAttribute(action.id)}" data-severity="${action.severity}">${glyphSvg(severityGlyphs[action.severity], "lintel-action-pin-shape")}${marks}</span>`;
}

export const severityColours: Record<Severity, string> = {
  critical: "#a3212b",
  major: "#9a4a06",
  minor: "#1d5e73",
};
