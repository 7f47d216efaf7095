import type { Config } from "tailwindcss";

// Tailwind v4 reads this file through the `@config` line in app/globals.css.
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        // Our own palette: "ink" for text, "dusk" for the navigation rail,
        // "glow" for the accent drawn from a PL emission colour.
        ink: { DEFAULT: "#1d2430", soft: "#4b5566", faint: "#8a93a3" },
        dusk: { DEFAULT: "#18202c", light: "#243043", line: "#33415a" },
        glow: { DEFAULT: "#d9622b", soft: "#fbe6da", deep: "#a8431a" },
        leaf: { DEFAULT: "#2f8a5b", soft: "#dcf1e5" },
        caution: { DEFAULT: "#b7791f", soft: "#fdf3d8" },
      },
      fontFamily: {
        sans: ["var(--font-inter)", "system-ui", "sans-serif"],
      },
    },
  },
};

export default config;
