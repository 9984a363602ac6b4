import type { NewCatalogCell } from "../schema/catalog";

/**
 * Temperature, life and minimum-voltage data for the demo catalogs, by series (invented makers,
 * invented figures typical of their kind, common practice): EDLC 1000–1500 h at 65 °C and their
 * rated voltage, −40 to 65 °C; hybrid (lithium-ion) capacitors 1000 h at 70 or 85 °C, down to
 * −20 or −30 °C, never below 2.2 V (2.5 V for one flat series); snap-in electrolytics 2000–3000 h
 * at 105 °C, screw-terminal ones 5000 h at 85 °C; polypropylene film 100,000 h at 70 °C. Cold
 * factors give capacitance and ESR at the bottom of the range against 25 °C (film: not given, it
 * hardly changes). The thermal resistance to ambient is worked out from each cell's surface as
 * 1/(h·A) with h = 10 W/(m²·K) for a bare cell in still air (common practice, from memory).
 */
interface SeriesLife {
  ratedLifeHours: number;
  ratedLifeTemperatureC: number;
  minTemperatureC: number;
  maxTemperatureC: number;
  coldCapacitanceFactor: number | null;
  coldEsrFactor: number | null;
  minVoltageV: number | null;
}

const edlc = (hours: number, cold: [number, number]): SeriesLife => ({
  ratedLifeHours: hours,
  ratedLifeTemperatureC: 65,
  minTemperatureC: -40,
  maxTemperatureC: 65,
  coldCapacitanceFactor: cold[0],
  coldEsrFactor: cold[1],
  minVoltageV: null,
});
const hybrid = (ratedC: number, minC: number, minV: number, cold: [number, number]): SeriesLife => ({
  ratedLifeHours: 1000,
  ratedLifeTemperatureC: ratedC,
  minTemperatureC: minC,
  maxTemperatureC: ratedC,
  coldCapacitanceFactor: cold[0],
  coldEsrFactor: cold[1],
  minVoltageV: minV,
});
const electrolytic = (hours: number, ratedC: number, minC: number, esrCold: number): SeriesLife => ({
  ratedLifeHours: hours,
  ratedLifeTemperatureC: ratedC,
  minTemperatureC: minC,
  maxTemperatureC: ratedC,
  coldCapacitanceFactor: 0.85,
  coldEsrFactor: esrCold,
  minVoltageV: null,
});
const film = (maxC: number): SeriesLife => ({
  ratedLifeHours: 100_000,
  ratedLifeTemperatureC: 70,
  minTemperatureC: -40,
  maxTemperatureC: maxC,
  coldCapacitanceFactor: null,
  coldEsrFactor: null,
  minVoltageV: null,
});

export const SERIES_LIFE: Record<string, SeriesLife> = {
  Fenwall: edlc(1500, [0.9, 2]),
  "Fenwall Graded": edlc(1500, [0.9, 2]),
  Fenlet: edlc(1000, [0.85, 2.5]),
  Skerry: edlc(1000, [0.85, 2.5]),
  Minnow: edlc(1000, [0.8, 3]),
  Vardal: hybrid(70, -20, 2.2, [0.8, 3]),
  "Vardal Round": hybrid(70, -30, 2.2, [0.75, 3.5]),
  "Skerry-H": hybrid(85, -25, 2.2, [0.8, 3]),
  "Skerry-H Flat": hybrid(85, -25, 2.5, [0.8, 3]),
  Cobble: electrolytic(3000, 105, -25, 4),
  "Cobble HV": electrolytic(2000, 105, -25, 4),
  Moorline: electrolytic(5000, 85, -40, 5),
  "Moorline HV": electrolytic(5000, 85, -25, 5),
  Slatefold: film(85),
  "Slatefold HV": film(85),
  Courtlink: film(105),
  "Courtlink HV": film(105),
  Courtbox: film(105),
};

/** Heat transfer from a bare cell's surface in still air (W/(m²·K)): common practice, from memory. */
const CELL_SURFACE_HEAT_TRANSFER = 10;

type SeedCell = Omit<NewCatalogCell, "shopId">;

/** Surface of a cell (m²) from its shape and dimensions. */
function surfaceM2(c: SeedCell): number {
  const h = c.heightMm / 1000;
  if (c.shape === "cylinder") {
    const d = (c.diameterMm ?? 0) / 1000;
    return Math.PI * d * h + (Math.PI * d * d) / 2;
  }
  const l = (c.lengthMm ?? 0) / 1000;
  const w = (c.widthMm ?? 0) / 1000;
  return 2 * (l * w + l * h + w * h);
}

/** The demo rows with their series' life data and a thermal resistance from their surface. */
export function withLifeData(cells: SeedCell[]): SeedCell[] {
  return cells.map((c) => {
    const life = SERIES_LIFE[c.series];
    if (!life) throw new Error(`no life data for the demo series ${c.series}`);
    return { ...c, ...life, thermalResistanceKPerW: Number((1 / (CELL_SURFACE_HEAT_TRANSFER * surfaceM2(c))).toPrecision(2)) };
  });
}
