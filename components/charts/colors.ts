/** Theme colours (tailwind.config.ts) for SVG charts, which cannot take utility classes. */
export const CHART_COLORS = {
  ink: "#2e3b59",
  inkLight: "#97a8c7",
  grid: "#e3e8f1",
  copper: "#c8733a",
  charge: "#1f9e8c",
  hazard: "#d99a06",
  danger: "#d23c32",
} as const;
