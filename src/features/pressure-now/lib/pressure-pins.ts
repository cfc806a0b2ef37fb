import "./pressure-pins.css";

import { polygonCentroid } from "@shared/calc/plan-geometry";
import type { PlanPoint } from "@shared/calc/plan-geometry";
import type { PressureRoomNow } from "@shared/schemas/pressure-site";

import { severityPalette } from "@/components/ui/palette";

import { needsAttention } from "./pressure-words";

function escapeText(value: string): string {
  return value.replaceAll("&", "&amp;").replaceAll('"', "&quot;").replaceAll("<", "&lt;");
}

const pinWords: Record<"excursion" | "no_readings", string> = {
  excursion: "Not negative",
  no_readings: "No readings",
};

/** An excursion is a critical matter (critical's colour); a silence a major one. */
const pinColours: Record<"excursion" | "no_readings", string> = {
  excursion: severityPalette.critical,
  no_readings: severityPalette.major,
};

/** What a room's pressure pin is: where, its markup (a mark with its words beside it), its title. */
export interface PressurePin {
  id: string;
  position: PlanPoint;
  html: string;
  title: string;
}

/**
 * A pin for each room on the floor whose state needs someone: in excursion ("!" and "Not negative")
 * or silent ("?" and "No readings"). The words sit beside the
 * mark on the plan itself, so the colour never carries the meaning alone.
 */
export function pressurePins(
  rooms: readonly PressureRoomNow[],
  spaces: readonly { id: string; polygon: readonly (readonly [number, number])[] }[],
): PressurePin[] {
  const polygons = new Map(spaces.map((space) => [space.id, space.polygon]));
  return rooms.flatMap((room) => {
    const polygon = polygons.get(room.spaceId);
    if (!polygon || polygon.length === 0 || !needsAttention(room.state)) return [];
    const state = room.state as "excursion" | "no_readings";
    const words = pinWords[state];
    return [
      {
        id: `pressure-${room.spaceId}`,
        position: polygonCentroid(polygon),
        title: `${room.spaceName}: ${words.toLowerCase()}`,
        html: `<span class="lintel-pressure-pin is-${state}" style="color:${pinColours[state]}" data-pressure-space="${escapeText(room.spaceId)}" data-pressure-state="${state}"><span class="lintel-pressure-pin-mark" aria-hidden="true"></span><span class="lintel-pressure-pin-words">${escapeText(words)}</span></span>`,
      },
    ];
  });
}
