import type { ZoneType } from "@shared/zones";

export interface ZoneStyle {
  /** Outline and fill colour, from the brand tokens. */
  colour: string;
  /** Each zone type has its own line pattern, so colour is never the only cue. */
  dashArray: string | undefined;
}

// Red stays free for the spacing warning; verdict colours stay free for verdicts.
export const zoneStyles: Record<ZoneType, ZoneStyle> = {
  isolation_room: { colour: "#163b3d", dashArray: undefined },
  anteroom: { colour: "#4a5866", dashArray: "12 6" },
  donning_zone: { colour: "#2a7275", dashArray: "2 6" },
  doffing_area: { colour: "#b5622f", dashArray: "14 5 3 5" },
};

export const zoneOrder: Record<ZoneType, number> = {
  isolation_room: 0,
  anteroom: 1,
  donning_zone: 2,
  doffing_area: 3,
};

export const spacingWarningColour = "#a3212b";
