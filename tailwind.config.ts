import type { Config } from "tailwindcss";

// Gaffline's own identity (see DEVELOPERS.md): ink and paper, copper as the accent,
// state colours from a colour-blind-safe set, always paired with a word or icon.
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      fontFamily: {
        sans: ["Manrope", "ui-sans-serif", "system-ui", "sans-serif"],
      },
      colors: {
        ink: { DEFAULT: "#16232b", 700: "#2b3a42", 500: "#56656c", 300: "#9aa5a9" },
        paper: { DEFAULT: "#f6f4ef", 50: "#fbfaf7", 200: "#ebe7dd" },
        rule: "#d9d4c7",
        // copper a shade deeper than the mark's #a85a24 so copper text holds 4.5:1 on paper and its tints (WCAG 1.4.3)
        copper: { DEFAULT: "#9c531f", 600: "#8e4a1b", 100: "#f4e4d6" },
        block: { DEFAULT: "#b34700", bg: "#fbe6d9" },
        warn: { DEFAULT: "#8a5a00", bg: "#fbefc9" },
        clear: { DEFAULT: "#00664a", bg: "#d8f0e6" },
        info: { DEFAULT: "#005a8c", bg: "#dcecf6" },
        waived: { DEFAULT: "#8a3f6f", bg: "#f4e1ec" },
      },
      fontSize: {
        xs: ["0.75rem", { lineHeight: "1rem" }],
        sm: ["0.875rem", { lineHeight: "1.25rem" }],
        base: ["1rem", { lineHeight: "1.5rem" }],
        lg: ["1.25rem", { lineHeight: "1.75rem" }],
        xl: ["1.5rem", { lineHeight: "2rem" }],
        "2xl": ["2rem", { lineHeight: "2.5rem" }],
      },
      borderRadius: { card: "10px" },
    },
  },
};

export default config;
