import {
  meetsThreshold,
  outcomeOfEntry,
  type Threshold,
  thresholdFor,
} from "@shared/calc/answer-rules";
import { type Outcome, readinessOf, scoreOf, type Verdict } from "@shared/calc/verdict";
import type { AuditDetail, ReadingUnit } from "@shared/schemas/audits";
import type { ChecklistItem } from "@shared/schemas/checklists";
import type { ZoneType } from "@shared/zones";

/** What an auditor records against one item, as entered (readings in the unit chosen). */
export interface AnswerFields {
  outcome: Outcome | null;
  value: number | null;
  unit: ReadingUnit | null;
  count: number | null;
  choice: string | null;
  note: string | null;
}

export type RoomFacts = AuditDetail["room"];

export type { Threshold };

export const emptyAnswer: AnswerFields = {
  outcome: null,
  value: null,
  unit: null,
  count: null,
  choice: null,
  note: null,
};

/** The shared answer rules (the server judges with the same ones). */
export { meetsThreshold, thresholdFor };

/**
 * Whether the value itself decides pass or fail (a reading or count with a limit, or a choice);
 * otherwise the auditor judges with Pass and Fail.
 */
export function isJudgedByValue(item: ChecklistItem, room: RoomFacts): boolean {
  if (item.response === "choice") return true;
  if (item.response === "reading" || item.response === "count") {
    return thresholdFor(item, room) !== null;
  }
  return false;
}

/** Pass or fail from the entered value, count or choice; null while there is none to judge. */
export function outcomeFromEntry(
  item: ChecklistItem,
  fields: AnswerFields,
  room: RoomFacts,
): Outcome | null {
  return outcomeOfEntry(item, fields, room);
}

export const criticalNotApplicableMessage =
  "A critical item marked not applicable needs a note saying why.";
export const photoNeededMessage = "This failed item needs a photo of the problem.";
export const unansweredMessage = "Not answered yet.";

/** Not applicable on a critical item needs a note. */
export function needsNote(item: ChecklistItem, fields: AnswerFields | undefined): boolean {
  return (
    item.severity === "critical" &&
    fields?.outcome === "not_applicable" &&
    (fields.note ?? "").trim() === ""
  );
}

/** A reading, count or choice answered pass or fail without the value itself. */
export function missingEntry(item: ChecklistItem, fields: AnswerFields | undefined): string | null {
  if (!fields?.outcome || fields.outcome === "not_applicable") return null;
  if (item.response === "reading" && (fields.value === null || fields.unit === null)) {
    return "Enter the reading.";
  }
  if (item.response === "count" && fields.count === null) return "Enter the count.";
  if (item.response === "choice" && fields.choice === null) return "Choose one of the options.";
  return null;
}

export function needsPhoto(
  item: ChecklistItem,
  fields: AnswerFields | undefined,
  photoCount: number,
): boolean {
  return item.photoOnFail && fields?.outcome === "fail" && photoCount === 0;
}

export interface ItemProblem {
  item: ChecklistItem;
  /** Position in the checklist, from 0. */
  index: number;
  message: string;
}

export interface AuditReview {
  unanswered: ItemProblem[];
  /** Answered items that still stop the audit from being submitted. */
  problems: ItemProblem[];
  failed: ChecklistItem[];
  ready: boolean;
}

/**
 * What stands between the draft and submitting it: the same rules the server applies, checked on
 * the phone so the auditor can put them right without a connection.
 * `refusals` are messages the server or the sync gave for particular items.
 */
export function reviewAudit(
  items: readonly ChecklistItem[],
  answers: ReadonlyMap<string, AnswerFields>,
  photoCounts: ReadonlyMap<string, number>,
  refusals: Readonly<Record<string, string>> = {},
): AuditReview {
  const unanswered: ItemProblem[] = [];
  const problems: ItemProblem[] = [];
  const failed: ChecklistItem[] = [];
  items.forEach((item, index) => {
    const fields = answers.get(item.id);
    if (!fields?.outcome) {
      unanswered.push({ item, index, message: unansweredMessage });
      return;
    }
    if (fields.outcome === "fail") failed.push(item);
    const missing = missingEntry(item, fields);
    if (needsNote(item, fields)) {
      problems.push({ item, index, message: criticalNotApplicableMessage });
    } else if (missing) {
      problems.push({ item, index, message: missing });
    } else if (needsPhoto(item, fields, photoCounts.get(item.id) ?? 0)) {
      problems.push({ item, index, message: photoNeededMessage });
    } else if (refusals[item.id]) {
      problems.push({ item, index, message: refusals[item.id]! });
    }
  });
  return {
    unanswered,
    problems,
    failed,
    ready: unanswered.length === 0 && problems.length === 0,
  };
}

/**
 * The verdict, its reasons and the score the answers give, worked out on the phone with the same
 * rules as the server, before the server confirms.
 */
export function resultOnPhone(
  zoneType: ZoneType,
  items: readonly ChecklistItem[],
  answers: ReadonlyMap<string, AnswerFields>,
): { verdict: Verdict; reasons: string[]; score: number | null } {
  const scored = items.flatMap((item) => {
    const outcome = answers.get(item.id)?.outcome;
    return outcome ? [{ key: item.key, text: item.text, severity: item.severity, outcome }] : [];
  });
  return { ...readinessOf(zoneType, scored), score: scoreOf(scored) };
}

/** "84%" from a score in [0, 1]. */
export function formatScore(score: number | null): string {
  return score === null ? "No score" : `${Math.round(score * 100)}%`;
}
