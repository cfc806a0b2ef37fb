import { airChangesPerHour, minimumAirChanges, purgeMinutes } from "@shared/calc/ventilation";
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
  let airChanges: number | null = null;
  let airChangesFrom: VentilationFigures["airChangesFrom"] = null;
  if (airflow !== null && airflow >= 0 && volumeM3 !== null && volumeM3 > 0) {
    airChanges = airChangesPerHour(airflow, volumeM3);
    airChangesFrom = "airflow";
  } else {
    const read = storedReading(items, answers, "air_changes");
    if (read !== null && read >= 0) {
      airChanges = read;
      airChangesFrom = "reading";
    }
  }
  const minimum =
    room?.minimumAirChanges ??
    (room?.constructionClass ? minimumAirChanges[room.constructionClass] : null);
  const purge = (efficiency: number) =>
    airChanges !== null && airChanges > 0 ? purgeMinutes(airChanges, efficiency) : null;

  return {
    airflow,
    volumeM3,
    airChanges,
    airChangesFrom,
    minimumAirChanges: minimum,
    minutesTo99: purge(99),
    minutesTo999: purge(99.9),
  };
}
