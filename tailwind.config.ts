import type { Config } from "tailwindcss";

/**
 * Tautline's palette and type scale, defined once.
 * Surfaces are the greys of wet and dry concrete, text and primary actions one deep ink,
 * and the signal colours are kept for verdicts and flags only. Every signal is always
 * paired with an icon and a word on screen, never carried by colour alone.
 */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        concrete: {
          50: "#f6f5f2", // dry slab in sun
          100: "#ecebe6",
          200: "#dcdad3",
          300: "#c3c0b6",
          400: "#9d998d",
          500: "#77746a",
          600: "#5a5850", // wet slab
          700: "#44433d",
        },
        ink: {
          DEFAULT: "#14213d",
          soft: "#2b3a5c",
          faint: "#4a5878",
        },
        signal: {
          band: "#1d6b3a", // in band
          "band-bg": "#e3f1e7",
          long: "#8a4b00", // measured above the band
          "long-bg": "#fbeedb",
          short: "#1f4e99", // measured below the band
          "short-bg": "#e2ebf8",
          stop: "#a3181b", // flags that need a person
          "stop-bg": "#f9e1e1",
        },
      },
      fontFamily: {
        sans: ["var(--font-sans)", "system-ui", "sans-serif"],
      },
      fontSize: {
        // Field log body text never below 18 px; numbers are the heroes.
        label: ["0.875rem", { lineHeight: "1.25rem", letterSpacing: "0.02em" }],
        body: ["1.125rem", { lineHeight: "1.6rem" }],
        lead: ["1.375rem", { lineHeight: "1.9rem" }],
        figure: ["2rem", { lineHeight: "2.4rem" }],
        hero: ["2.75rem", { lineHeight: "3.1rem" }],
      },
      minHeight: { touch: "3rem" },
      minWidth: { touch: "3rem" },
    },
  },
};

export default config;
