import "./action-pins.css";

import type { ActionSummary } from "@shared/schemas/actions";

import { type MarkerName, markerMarkup, severityMarkers } from "@/components/ui/markers";
import { markSvg } from "@/components/ui/marks";

import { severityLabels } from "./action-labels";

function markerSvg(name: MarkerName, className: string): string {
  return `<svg viewBox="0 0 24 24" class="${className}" aria-hidden="true" focusable="false">${markerMarkup(name)}</svg>`;
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
    action.overdue ? markerSvg("overdue", "lintel-action-pin-clock") : "",
    action.state === "to_check" ? markSvg("to_check", "lintel-action-pin-check") : "",
  ].join("");
  const colour = severityMarkers[action.severity].colour;
  return `<span class="${classes}" style="color:${colour}" data-action-id="${escapeAttribute(action.id)}" data-severity="${action.severity}">${markerSvg(action.severity, "lintel-action-pin-shape")}${marks}</span>`;
}
