import type { Config } from "tailwindcss";

/** Tapwright's palette: calm slate neutrals, a deep-teal brand, amber for production, red only for faults. */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  darkMode: "class",
  theme: {
    extend: {
      colors: {
        brand: { 50: "#ecfdf9", 100: "#cff7ee", 300: "#6fdcc6", 500: "#159f8c", 600: "#0e8272", 700: "#0f675c", 900: "#0c3d37" },
        production: "#f2a93b",
        fault: "#dc3f3f",
        canvas: "#0d1420",
      },
      fontFamily: {
        sans: ["var(--font-inter)", "ui-sans-serif", "system-ui", "sans-serif"],
        mono: ["var(--font-mono)", "ui-monospace", "monospace"],
      },
    },
  },
};

export default config;
