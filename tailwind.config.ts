import type { Config } from "tailwindcss";

/** Heatpath's palette: ink on warm paper, ember for the corrected curve, frost for cold service. */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#fbf8f3", deep: "#f3ede3" },
        ink: { DEFAULT: "#1d2430", soft: "#3d4656", muted: "#5f6878", line: "#d9d2c5" },
        ember: { 50: "#fff4ec", 100: "#ffe3cf", 500: "#e0591b", 600: "#c2450f", 700: "#9b350b" },
        frost: { 50: "#eef7fa", 100: "#d5edf4", 500: "#1f7a99", 600: "#17627c", 700: "#114c60" },
        moss: { 50: "#eef6ee", 600: "#2f7a3b", 700: "#25612f" },
        flag: { 50: "#fdf0f0", 600: "#b42323", 700: "#8f1c1c" },
      },
      fontFamily: {
        sans: ["var(--font-inter)", "var(--font-inter-greek)", "system-ui", "sans-serif"],
      },
      boxShadow: { card: "0 1px 0 rgba(29,36,48,0.04), 0 1px 3px rgba(29,36,48,0.08)" },
    },
  },
  plugins: [],
};

export default config;
