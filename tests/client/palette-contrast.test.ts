import { describe, expect, it } from "vitest";

import { markers, chartLines } from "@/components/ui/markers";
import {
  actionStatePalette,
  badgeTintOpacity,
  chartPalette,
  grounds,
  severityPalette,
  verdictPalette,
} from "@/components/ui/palette";

// Contrast as defined by WCAG 2.1: relative luminance (success criterion 1.4.3, "relative
// luminance" and "contrast ratio" in the WCAG 2.1 glossary), needing 4.5:1 for text (1.4.3) and
// 3:1 for graphics that carry meaning (1.4.11).

function channels(hex: string): [number, number, number] {
  const value = hex.replace("#", "");
  return [0, 2, 4].map((at) => Number.parseInt(value.slice(at, at + 2), 16)) as [
    number,
    number,
    number,
  ];
}

function relativeLuminance(hex: string): number {
  const [r, g, b] = channels(hex).map((channel) => {
    const c = channel / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  }) as [number, number, number];
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

function contrastRatio(a: string, b: string): number {
  const [light, dark] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x) as [
    number,
    number,
  ];
  return (light + 0.05) / (dark + 0.05);
}

/** A colour laid over white at an opacity: the tint behind a badge's words. */
function tint(hex: string, opacity: number): string {
  return `#${channels(hex)
    .map((channel) => Math.round(channel * opacity + 255 * (1 - opacity)))
    .map((channel) => channel.toString(16).padStart(2, "0"))
    .join("")}`;
}

const markColours = {
  ...Object.fromEntries(Object.entries(severityPalette).map(([k, v]) => [`severity ${k}`, v])),
  ...Object.fromEntries(Object.entries(verdictPalette).map(([k, v]) => [`verdict ${k}`, v])),
  ...Object.fromEntries(Object.entries(actionStatePalette).map(([k, v]) => [`state ${k}`, v])),
};

describe("the mark palette's contrast (WCAG 2.1 AA)", () => {
  it("when the contrast formula is given black on white and a colour on itself, then it gives 21 and 1", () => {
    expect(contrastRatio("#000000", "#ffffff")).toBeCloseTo(21, 5);
    expect(contrastRatio("#777777", "#777777")).toBe(1);
    // A well-known pair: #767676 on white is just over 4.5:1.
    expect(contrastRatio("#767676", "#ffffff")).toBeGreaterThan(4.5);
    expect(contrastRatio("#777777", "#ffffff")).toBeLessThan(4.5);
  });

  for (const [name, colour] of Object.entries(markColours)) {
    it(`when ${name} words sit on white, the sunken grey or the badge's own tint, then they reach 4.5:1`, () => {
      for (const ground of [grounds.white, grounds.sunken, tint(colour, badgeTintOpacity)]) {
        expect(contrastRatio(colour, ground), `${colour} on ${ground}`).toBeGreaterThanOrEqual(4.5);
      }
    });

    it(`when white words sit on solid ${name} (banners, overdue chips), then they reach 4.5:1`, () => {
      expect(contrastRatio("#ffffff", colour)).toBeGreaterThanOrEqual(4.5);
    });
  }

  it("when markers and chart lines are drawn on white or a tinted row, then each reaches 3:1", () => {
    const graphics = [
      ...Object.values(markers).map((marker) => marker.colour),
      ...Object.values(chartLines).map((line) => line.colour),
      chartPalette.value,
      chartPalette.flagged,
    ];
    for (const colour of graphics) {
      for (const ground of [grounds.white, grounds.brandTint, grounds.clayTint]) {
        expect(contrastRatio(colour, ground), `${colour} on ${ground}`).toBeGreaterThanOrEqual(3);
      }
    }
  });

  it("when chart words (axis ticks, legends) are drawn, then they reach 4.5:1 on white", () => {
    expect(contrastRatio(chartPalette.reference, grounds.white)).toBeGreaterThanOrEqual(4.5);
    expect(contrastRatio(chartPalette.ink, grounds.white)).toBeGreaterThanOrEqual(4.5);
  });
});
