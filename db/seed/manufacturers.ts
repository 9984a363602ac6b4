/**
 * Invented cell makers used by the demo catalogs. None of them is a real company or brand;
 * every demo catalog row names one of these (the seed unit test checks it).
 */
export const makers = {
  quillfen: "Quillfen Storage",
  oskerel: "Oskerel Cells",
  lindqvar: "Lindqvar Electric",
  veltrane: "Veltrane Components",
  gorsemoor: "Gorsemoor Capacitor Co.",
  tarnwick: "Tarnwick Dielectrics",
  pellacourt: "Pellacourt Film Works",
} as const;

export type DemoManufacturer = (typeof makers)[keyof typeof makers];

export const DEMO_MANUFACTURERS: readonly DemoManufacturer[] = Object.values(makers);
