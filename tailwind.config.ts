import type { Config } from "tailwindcss";

// Lintel's design tokens. The palette is our own: a deep "slate-teal" brand, a warm "clay"
// accent, and verdict colours chosen for AA contrast against white text and white backgrounds.
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
        verdict: {
          ready: "#1d6b3a",
          conditions: "#8a5a00",
          "not-ready": "#a3212b",
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
