import type { Config } from "tailwindcss";

/**
 * Chalkline design tokens. A calm workshop palette: unbleached paper, graphite ink,
 * an oxidised-copper accent for actions, ochre for cautions and brick for errors.
 */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./canvas/**/*.{ts,tsx}"],
  theme: {
    colors: {
      transparent: "transparent",
      current: "currentColor",
      white: "#ffffff",
      black: "#000000",
      paper: {
        DEFAULT: "#f6f3ec",
        50: "#fbfaf6",
        100: "#f6f3ec",
        200: "#ece6d9",
        300: "#ddd4c1",
      },
      ink: {
        DEFAULT: "#23262b",
        900: "#181a1e",
        800: "#23262b",
        700: "#363a41",
        600: "#4c515a",
        500: "#686e78",
        400: "#8b909a",
        300: "#b3b7be",
        200: "#d5d8dc",
        100: "#eceef0",
      },
      patina: {
        DEFAULT: "#2f6f66",
        900: "#173833",
        800: "#1f4a44",
        700: "#275d56",
        600: "#2f6f66",
        500: "#3f8a80",
        400: "#63a79d",
        300: "#94c6be",
        200: "#c5e1dc",
        100: "#e6f2f0",
      },
      ochre: {
        DEFAULT: "#b7791f",
        800: "#6e4811",
        700: "#8f5e16",
        600: "#b7791f",
        300: "#ecc77f",
        100: "#fbf0d9",
      },
      brick: {
        DEFAULT: "#a8412f",
        800: "#65261b",
        700: "#873425",
        600: "#a8412f",
        300: "#e4a194",
        100: "#f8e4df",
      },
      chalk: "#fdfdfb",
    },
    fontFamily: {
      sans: ["var(--font-sans)", "system-ui", "sans-serif"],
      mono: ["var(--font-mono)", "ui-monospace", "monospace"],
    },
    fontSize: {
      // A modest 1.2 ratio scale; sizes in rem with their own line heights.
      xs: ["0.75rem", { lineHeight: "1rem" }],
      sm: ["0.875rem", { lineHeight: "1.25rem" }],
      base: ["1rem", { lineHeight: "1.5rem" }],
      lg: ["1.2rem", { lineHeight: "1.75rem" }],
      xl: ["1.44rem", { lineHeight: "2rem" }],
      "2xl": ["1.728rem", { lineHeight: "2.25rem" }],
      "3xl": ["2.074rem", { lineHeight: "2.5rem" }],
    },
    extend: {
      spacing: {
        // Named layout steps on top of Tailwind's 4 px grid.
        gutter: "1.25rem",
        rail: "15rem",
        panel: "20rem",
        bar: "3.5rem",
      },
      borderRadius: {
        card: "0.625rem",
      },
      boxShadow: {
        card: "0 1px 2px rgba(24, 26, 30, 0.06), 0 1px 1px rgba(24, 26, 30, 0.04)",
        lift: "0 8px 24px rgba(24, 26, 30, 0.12)",
      },
    },
  },
  plugins: [],
};

export default config;
