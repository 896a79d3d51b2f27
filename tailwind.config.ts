import type { Config } from "tailwindcss";

/** Loamwork's field-notebook palette: paper, soil ink, one accent; contrast checked for sunlight. */
export default {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#f7f2e8", deep: "#efe6d3", edge: "#d9ccb1" },
        ink: { DEFAULT: "#2e2116", soft: "#5a4632", faint: "#6b5843" },
        accent: { DEFAULT: "#1d5c8c", dark: "#13426a", light: "#dbe8f3" },
        warn: { DEFAULT: "#9a3b12", light: "#f7e0d2" },
        ok: { DEFAULT: "#2f6b2f", light: "#e0eedb" },
      },
      fontFamily: {
        serif: ["var(--font-serif)", "Georgia", "serif"],
        mono: ["var(--font-mono)", "ui-monospace", "monospace"],
      },
    },
  },
} satisfies Config;
