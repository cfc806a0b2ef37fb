import type { Config } from "tailwindcss";

import { actionStatePalette, severityPalette, verdictPalette } from "./src/components/ui/palette";

// Lintel's design tokens. The palette is our own: a deep "slate-teal" brand, a warm "clay"
// accent. Severity and verdict colours come from the one mark palette in
// src/components/ui/palette.ts (shared with the map pins and charts, contrast-tested).
export default {
  content: ["./index.html", "./src/**/*.{ts,tsx}"],
  theme: {
    extend: {
      fontFamily: {
        sans: ['"Noto Sans"', "system-ui", "sans-serif"],
      },
      colors: {
        brand: {
          50: "#eef6f6",
          100: "#d3e8e8",
          200: "#a7d0d1",
          300: "#6fb0b2",
          400: "#3f8d90",
          500: "#2a7275",
          600: "#1f5c5f",
          700: "#1a4a4d",
          800: "#163b3d",
          900: "#102b2d",
        },
        clay: {
          50: "#fbf4ef",
          100: "#f4e2d4",
          500: "#b5622f",
          600: "#9a4f22",
          700: "#7c3f1b",
        },
        ink: {
          DEFAULT: "#17212b",
          muted: "#4a5866",
          subtle: "#6b7885",
        },
        surface: {
          DEFAULT: "#ffffff",
          sunken: "#f3f5f6",
          line: "#d7dde2",
        },
        // Named by old verdict codes because forms, alerts and buttons reuse them as
        // "good / warning / error"; the values are the mark palette's.
        verdict: {
          ready: verdictPalette.all_clear,
          conditions: verdictPalette.gaps_to_fix,
          "not-ready": verdictPalette.hold,
        },
        severity: severityPalette,
        action: {
          "to-fix": actionStatePalette.to_fix,
          fixing: actionStatePalette.fixing,
          "to-check": actionStatePalette.to_check,
          done: actionStatePalette.done,
        },
      },
      spacing: {
        tap: "2.75rem",
      },
      fontSize: {
        "2xs": ["0.6875rem", { lineHeight: "1rem" }],
      },
      borderRadius: {
        card: "0.75rem",
      },
    },
  },
} satisfies Config;
