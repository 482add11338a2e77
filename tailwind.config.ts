import type { Config } from "tailwindcss";

/** Tapwright's palette and type: named tokens only, so components never carry raw hex. */
export default {
  content: ["./index.html", "./src/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        // Deep blue-grey: navigation, headings, body text.
        ink: {
          50: "#f2f5f8",
          100: "#e3e8ee",
          200: "#c9d2dc",
          300: "#a3b1c0",
          400: "#7b8ca0",
          500: "#5a6b7f",
          600: "#445467",
          700: "#334253",
          800: "#243140",
          900: "#18222e",
          950: "#0f161f",
        },
        // Warm off-white surfaces.
        paper: {
          50: "#fdfcfa",
          100: "#f8f6f1",
          200: "#f0ece4",
          300: "#e3ddd1",
          400: "#cec5b5",
        },
        // Teal: primary actions and float-reference traces.
        signal: {
          50: "#edf9f7",
          100: "#d0f0eb",
          200: "#a3e0d7",
          300: "#69c9bc",
          400: "#34ad9f",
          500: "#188f82",
          600: "#10746b",
          700: "#0f5d56",
          800: "#0f4a45",
          900: "#0d3c39",
        },
        // Copper: fixed-point traces and the accent.
        copper: {
          50: "#fcf5ef",
          100: "#f7e5d5",
          200: "#eecaab",
          300: "#e2a87a",
          400: "#d4864d",
          500: "#bf6a31",
          600: "#a05427",
          700: "#814322",
          800: "#683720",
          900: "#552e1c",
        },
        pass: {
          50: "#eef8f1",
          100: "#d4eedc",
          300: "#7fc895",
          500: "#2e8a4a",
          600: "#23703b",
          700: "#1c5a30",
          800: "#174826",
        },
        warn: {
          50: "#fdf7e7",
          100: "#f8e8bd",
          300: "#eec160",
          500: "#c28a0f",
          600: "#9c6e0a",
          700: "#7b560c",
          800: "#5f430d",
        },
        fail: {
          50: "#fcefee",
          100: "#f7d5d2",
          300: "#e78b83",
          500: "#c8443a",
          600: "#a8352d",
          700: "#872b25",
          800: "#6b2520",
        },
      },
      fontFamily: {
        sans: ['"Inter"', "system-ui", "sans-serif"],
        mono: ['"JetBrains Mono"', "ui-monospace", "monospace"],
      },
    },
  },
} satisfies Config;
