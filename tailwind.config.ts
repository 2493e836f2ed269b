import type { Config } from "tailwindcss";

/**
 * Cellwright's look: a lab notebook. Warm paper, ink-dark text, one copper accent (the colour of a
 * cell's current collector). Outcome colours support words, never replace them.
 * Contrast of each text colour on `paper` is ≥ 4.5:1 (WCAG 2.2 AA), checked in tests/unit/theme.test.ts.
 */
export const palette = {
  paper: "#f8f5ee",
  "paper-deep": "#efe9dc",
  rule: "#d8cfbd",
  ink: "#1d2126",
  "ink-soft": "#4a4f57",
  copper: "#9b4a1b",
  "copper-deep": "#7a3a14",
  "copper-wash": "#f3e2d4",
  meets: "#2d6a3e",
  deviates: "#a02a1e",
  unassessed: "#575e6b",
} as const;

const config: Config = {
  content: [],
  theme: {
    extend: {
      colors: palette,
      fontFamily: {
        serif: ["var(--font-merriweather)", "var(--font-merriweather-ext)", "Georgia", "serif"],
        sans: ["system-ui", "-apple-system", "Segoe UI", "Roboto", "Helvetica Neue", "Arial", "sans-serif"],
      },
    },
  },
};

export default config;
