import { formatInZone } from "@shared/calc/due";
import type { ActionSummary } from "@shared/schemas/actions";
import { actionCloseReasonLabels } from "@shared/workflow/action-workflow";

export { severityLabels } from "@shared/calc/verdict";

/** The due time as the site's clock shows it, so everyone reads the same deadline. */
export function dueText(action: Pick<ActionSummary, "dueAt" | "siteTimeZone">): string {
  const due = new Date(action.dueAt);
  if (Number.isNaN(due.getTime())) return action.dueAt;
  return formatInZone(due, action.siteTimeZone);
}

export function daysToCloseText(days: number | null): string {
  if (days === null) return "";
  return `${days} ${days === 1 ? "day" : "days"}`;
}

/** What each timeline entry says happened, from the workflow's own words. */
export { timelineKindLabels as timelineLabels } from "@shared/workflow/action-workflow";

/** Why a done action is done, in words; a retirement is never shown as a fix. */
export function closeReasonText(action: Pick<ActionSummary, "closeReason">): string {
  return actionCloseReasonLabels[action.closeReason ?? "confirmed"];
}
