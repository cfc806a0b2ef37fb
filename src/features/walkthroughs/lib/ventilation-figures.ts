import {
  airChangesAgree,
  airChangesPerHour,
  minimumAirChanges,
  purgeMinutes,
} from "@shared/calc/ventilation";
import type { ChecklistItem } from "@shared/schemas/checklists";

import type { AnswerFields, RoomFacts } from "./answer-rules";
import { toStoredUnit } from "./reading-units";

export interface VentilationFigures {
  /** m³/h, from the airflow reading. */
  airflow: number | null;
  volumeM3: number | null;
  /** From the airflow and the room volume when both are known, else the auditor's ACH reading. */
  airChanges: number | null;
  airChangesFrom: "airflow" | "reading" | null;
  /** The minimum for the room's construction class. */
  minimumAirChanges: number | null;
  /** The class the minimum comes from; for a room with none, the one it is judged as. */
  judgedClass: "new_or_renovated" | "existing" | null;
  /** An isolation room with no class recorded, judged as new or renovated until one is set. */
  classUnset: boolean;
  /** The auditor's own air-change reading, and the figure airflow ÷ volume gives. */
  typedAirChanges: number | null;
  workedOutAirChanges: number | null;
  /** Both known and more than 10 % apart: the auditor must say which is right. */
  airChangesDisagree: boolean;
  /** Minutes for airborne contaminants to fall by 99% and 99.9% once the room is empty. */
  minutesTo99: number | null;
  minutesTo999: number | null;
}

function storedReading(
  items: readonly ChecklistItem[],
  answers: ReadonlyMap<string, AnswerFields>,
  quantity: ChecklistItem["quantity"],
): number | null {
  for (const item of items) {
    if (item.response !== "reading" || item.quantity !== quantity) continue;
    const answer = answers.get(item.id);
    if (answer?.value == null || answer.unit == null || answer.outcome === "not_applicable") {
      continue;
    }
    return toStoredUnit(answer.value, answer.unit);
  }
  return null;
}

/** The figures an auditor wants at an isolation room door, from what has been read so far. */
export function ventilationFigures(
  items: readonly ChecklistItem[],
  answers: ReadonlyMap<string, AnswerFields>,
  room: RoomFacts,
): VentilationFigures {
  const airflow = storedReading(items, answers, "airflow");
  const volumeM3 = room?.volumeM3 ?? null;
  const read = storedReading(items, answers, "air_changes");
  const typedAirChanges = read !== null && read >= 0 ? read : null;
  const workedOutAirChanges =
    airflow !== null && airflow >= 0 && volumeM3 !== null && volumeM3 > 0
      ? airChangesPerHour(airflow, volumeM3)
      : null;
  const airChanges = workedOutAirChanges ?? typedAirChanges;
  const airChangesFrom: VentilationFigures["airChangesFrom"] =
    workedOutAirChanges !== null ? "airflow" : typedAirChanges !== null ? "reading" : null;
  const minimum =
    room?.minimumAirChanges ??
    (room?.constructionClass ? minimumAirChanges[room.constructionClass] : null);
  // The server gives an isolation room without a class the new-or-renovated minimum; anterooms
  // without one get none.
  const classUnset = room !== null && room.constructionClass === null && minimum !== null;
  const judgedClass = room?.constructionClass ?? (classUnset ? "new_or_renovated" : null);
  const purge = (efficiency: number) =>
    airChanges !== null && airChanges > 0 ? purgeMinutes(airChanges, efficiency) : null;

  return {
    airflow,
    volumeM3,
    airChanges,
    airChangesFrom,
    minimumAirChanges: minimum,
    judgedClass,
    classUnset,
    typedAirChanges,
    workedOutAirChanges,
    airChangesDisagree:
      typedAirChanges !== null &&
      workedOutAirChanges !== null &&
      !airChangesAgree(typedAirChanges, workedOutAirChanges),
    minutesTo99: purge(99),
    minutesTo999: purge(99.9),
  };
}

/** Starts the note line by which an auditor confirms a typed air-change figure that disagrees. */
export const airChangesConfirmedPrefix = "Air changes confirmed:";

export function airChangesConfirmationLine(typed: number, workedOut: number): string {
  return `${airChangesConfirmedPrefix} the typed ${round1(typed)} ACH is right; airflow ÷ volume gives ${round1(workedOut)} ACH.`;
}

export function round1(value: number): string {
  return value.toFixed(1).replace(/\.0$/, "");
}

export const airChangesUnconfirmedMessage =
  "The typed air changes and those worked out from airflow ÷ volume differ by more than 10 %: say which is right.";

/**
 * The air-change item that cannot pass yet: its typed figure disagrees with airflow ÷ volume by
 * more than 10 % and the auditor has not confirmed it in the note (or replaced it). Keyed by item.
 */
export function unconfirmedAirChanges(
  items: readonly ChecklistItem[],
  answers: ReadonlyMap<string, AnswerFields>,
  figures: VentilationFigures | null,
): Record<string, string> {
  if (!figures?.airChangesDisagree) return {};
  const item = items.find(
    (candidate) =>
      candidate.response === "reading" &&
      candidate.quantity === "air_changes" &&
      answers.get(candidate.id)?.value != null,
  );
  const answer = item ? answers.get(item.id) : undefined;
  if (!item || !answer || answer.outcome === "not_applicable" || answer.outcome === null) return {};
  if ((answer.note ?? "").includes(airChangesConfirmedPrefix)) return {};
  return { [item.id]: airChangesUnconfirmedMessage };
}
