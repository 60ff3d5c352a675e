import type { Config } from "tailwindcss";

/**
 * Framefork's own palette. Hit levels and block classes each have a colour,
 * and the UI always prints the word beside it: colour never carries meaning
 * alone.
 */
const config: Config = {
  content: ["./src/**/*.{ts,tsx}"],
  darkMode: "class",
  theme: {
    extend: {
      colors: {
        ink: {
          950: "#0b0d12",
          900: "#11141b",
          850: "#161a23",
          800: "#1c212c",
          700: "#283040",
          600: "#3a4458",
          400: "#7d8aa3",
          300: "#a5b0c5",
          200: "#cfd6e4",
          100: "#e8ecf4",
        },
        accent: { DEFAULT: "#f5c451", strong: "#ffd873", muted: "#8a7235" },
        level: {
          high: "#f2b84b",
          mid: "#5aa9e6",
          low: "#e86a92",
          "special-mid": "#6fd0b4",
          throw: "#b69cf0",
          unblockable: "#ff7a45",
        },
        block: {
          plus: "#4cc38a",
          even: "#a5b0c5",
          safe: "#7cc4f0",
          punishable: "#f0a04b",
          "launch-punishable": "#f0524b",
          state: "#c39bf0",
        },
      },
      fontFamily: {
        mono: ['"JetBrains Mono"', "ui-monospace", "SFMono-Regular", "Menlo", "monospace"],
        sans: ["ui-sans-serif", "system-ui", "-apple-system", "Segoe UI", "Roboto", "sans-serif"],
      },
    },
  },
};

export default config;
