import type { Config } from "tailwindcss";

// Ordwise's own palette: slate-blue ink on warm paper, a copper accent, and verdict colours
// that are always paired with text and an icon.
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        // muted, pass and idle are dark enough for 4.5:1 on paper, paper-sunk and their light chips (WCAG 2.x contrast).
        ink: { DEFAULT: "#1d2a3a", soft: "#3c4b5e", muted: "#5a6677" },
        paper: { DEFAULT: "#faf8f4", raised: "#ffffff", sunk: "#f0ece4" },
        line: "#ddd6ca",
        copper: { DEFAULT: "#b4582a", dark: "#8f4320", light: "#f4e1d5" },
        pass: { DEFAULT: "#1b6e45", light: "#dcefe4" },
        fail: { DEFAULT: "#b3261e", light: "#f7dcd9" },
        caution: { DEFAULT: "#8a6100", light: "#f8ecc9" },
        idle: { DEFAULT: "#4e5a6a", light: "#e6e9ee" },
      },
      fontFamily: {
        sans: ["var(--font-sans)", "system-ui", "sans-serif"],
        mono: ["ui-monospace", "SFMono-Regular", "Menlo", "monospace"],
      },
      fontSize: {
        "2xs": ["0.6875rem", { lineHeight: "1rem" }],
      },
    },
  },
};

export default config;
