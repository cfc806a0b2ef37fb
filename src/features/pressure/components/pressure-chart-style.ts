import { chartPalette, severityPalette } from "@/components/ui/palette";

/** How the pressure chart draws each thing; its legend says the same in words. */
export const pressureChartStyle = {
  mean: { colour: chartPalette.value, width: 2 },
  band: { colour: chartPalette.value, opacity: 0.18 },
  threshold: { colour: chartPalette.ink, dash: "6 4", width: 1.5 },
  excursion: { colour: severityPalette.critical, opacity: 0.16 },
} as const;
