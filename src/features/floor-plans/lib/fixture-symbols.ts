import type { FixtureKind } from "@shared/zones";

/**
 * Our own line symbols, drawn on a 24-unit square with the current colour. The same markup serves
 * the map markers (Leaflet wants HTML) and the key and list (rendered as inline SVG).
 */
export const fixtureGlyphs: Record<FixtureKind, string> = {
  hand_rub_station:
    '<path d="M9 3.5h4.5M11.5 3.5V6M9.5 6h4v2.5"/><rect x="7" y="8.5" width="9" height="12" rx="2"/><path d="M9.5 14.5h4"/><path d="M19 4.5c.9 1.2 1.4 2 1.4 2.8a1.4 1.4 0 0 1-2.8 0c0-.8.5-1.6 1.4-2.8z"/>',
  clean_chair:
    '<path d="M6 4v16.5M6 13.5h10.5v7M6 17h10.5"/><path d="M17.5 3l.8 2 2 .8-2 .8-.8 2-.8-2-2-.8 2-.8z" fill="currentColor"/>',
  dirty_chair:
    '<path d="M6 4v16.5M6 13.5h10.5v7M6 17h10.5"/><path d="M14.5 3.5l5 5M19.5 3.5l-5 5"/>',
  hands_free_bin:
    '<path d="M5.5 7h13M10 7V5h4v2"/><path d="M7 7l1 13.5h8L17 7"/><path d="M10.5 10.5v7M13.5 10.5v7"/><path d="M2.5 20.5h4"/>',
  mirror:
    '<ellipse cx="12" cy="10" rx="5.5" ry="7.5"/><path d="M9.5 9l3-3M9.5 12.5l5-5"/><path d="M12 17.5v3.5M9 21h6"/>',
  glove_supply:
    '<path d="M8.5 21v-5.5L5.8 12a1.3 1.3 0 0 1 2-1.6L9 12V5.5a1.2 1.2 0 0 1 2.4 0V11V4.2a1.2 1.2 0 0 1 2.4 0V11V5.2a1.2 1.2 0 0 1 2.4 0V12V7.8a1.2 1.2 0 0 1 2.4 0v7.4c0 3.2-2 5.8-5.2 5.8z"/>',
  wipes:
    '<rect x="4.5" y="10" width="15" height="10.5" rx="2"/><path d="M4.5 13.5h15"/><path d="M9.5 10c0-3 1.2-5.2 2.5-6.5 1.3 1.3 2.5 3.5 2.5 6.5"/>',
  ppe_stock:
    '<path d="M3.5 12h17M3.5 20.5h17"/><rect x="5" y="5" width="5" height="7"/><rect x="11.5" y="7" width="7" height="5"/><rect x="6" y="14.5" width="12" height="6"/><path d="M12 14.5v6"/>',
  pressure_monitor:
    '<path d="M4.5 16a7.5 7.5 0 1 1 15 0"/><path d="M12 16l4-5"/><circle cx="12" cy="16" r="1.2" fill="currentColor"/><path d="M4 20.5h16M7 11.5l1.2 1M17 11.5l-1.2 1M12 8.5v1.5"/>',
  signage:
    '<rect x="4" y="3.5" width="16" height="10.5" rx="1.5"/><path d="M12 14v7M9 21h6M7.5 7.5h9M7.5 10.5h6"/>',
};

const svgAttributes =
  'viewBox="0 0 24 24" fill="none" stroke="currentColor" stroke-width="1.8" stroke-linecap="round" stroke-linejoin="round" aria-hidden="true" focusable="false"';

export function fixtureSvg(kind: FixtureKind): string {
  return `<svg ${svgAttributes}>${fixtureGlyphs[kind]}</svg>`;
}

export interface MarkerLook {
  flagged?: boolean;
  selected?: boolean;
}

/** The HTML inside a map marker: the symbol in a round badge, with a "!" when flagged. */
export function fixtureMarkerHtml(
  kind: FixtureKind,
  { flagged, selected }: MarkerLook = {},
): string {
  const classes = ["lintel-fixture", flagged ? "is-flagged" : "", selected ? "is-selected" : ""]
    .filter(Boolean)
    .join(" ");
  const flag = flagged ? '<span class="lintel-fixture-flag" aria-hidden="true">!</span>' : "";
  return `<span class="${classes}">${fixtureSvg(kind)}${flag}</span>`;
}
