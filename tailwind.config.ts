import type { Config } from "tailwindcss";

/** Faradsmith's own identity: deep "ink" blue, a copper accent, a cool "charge" teal. */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./emails/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        ink: {
          50: "#f3f5f9",
          100: "#e3e8f1",
          200: "#c3cde0",
          300: "#97a8c7",
          400: "#6a7fa8",
          500: "#4b5f8a",
          600: "#3a4b70",
          700: "#2e3b59",
          800: "#1f2840",
          900: "#141a2b",
        },
        copper: {
          50: "#fdf5ee",
          100: "#f9e3d1",
          300: "#e9a772",
          500: "#c8733a",
          600: "#a95c2a",
          700: "#874722",
        },
        charge: {
          100: "#d9f4f0",
          300: "#7fd6c8",
          500: "#1f9e8c",
          700: "#14695e",
        },
        hazard: { 100: "#fdecc8", 500: "#d99a06", 700: "#8a5a00" },
        danger: { 100: "#fde2e1", 500: "#d23c32", 700: "#9a241c" },
      },
      fontFamily: {
        sans: ["var(--font-plex-sans)", "system-ui", "sans-serif"],
        mono: ["var(--font-plex-mono)", "ui-monospace", "monospace"],
      },
    },
  },
};

export default config;
