import { formatInZone } from "@shared/calc/due";
import type { ActionSummary, TimelineKind } from "@shared/schemas/actions";

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

export const timelineLabels: Record<TimelineKind, string> = {
  opened: "Opened from a failed item",
  finding_added: "Found again in a later audit",
  assigned: "Given to a new owner",
  started: "Work started",
  proof_added: "Photo of the fix added",
  sent_for_verification: "Sent for verification",
  verified: "Verified and closed",
  rejected: "Proof rejected",
  reopened: "Reopened",
  space_retired: "Closed: space retired",
  space_restored: "Reopened: space restored",
};

/** Why a closed action closed, in words; a retirement is never shown as a fix. */
export function closeReasonText(action: Pick<ActionSummary, "closeReason">): string {
  return action.closeReason === "space_retired"
    ? "Space retired — not counted as fixed"
    : "Verified fixed by an auditor";
}
