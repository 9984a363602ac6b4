import Decimal from "decimal.js";
import { describe, expect, it } from "vitest";
import type { NewCatalogCell, NewCatalogComponent } from "@/db/schema/catalog";
import { kestrelCells, kestrelComponents } from "@/db/seed/catalog-kestrel";
import { marlowCells, marlowComponents } from "@/db/seed/catalog-marlow";
import { DEMO_MANUFACTURERS } from "@/db/seed/manufacturers";
import { DEMO_PASSWORD, demoPeople, demoShops } from "@/db/seed/people";
import { joinShopSchema, slugProblem } from "@/lib/validation/auth";
import { SHOP_CURRENCIES } from "@/lib/vocabulary";

type Cell = Omit<NewCatalogCell, "shopId">;
type Component = Omit<NewCatalogComponent, "shopId">;
type Technology = Cell["technology"];

const catalogs: { slug: string; cells: Cell[]; components: Component[] }[] = [
  { slug: "kestrel-bank-works", cells: kestrelCells, components: kestrelComponents },
  { slug: "marlow-pulse", cells: marlowCells, components: marlowComponents },
];

const TECHNOLOGIES: Technology[] = ["edlc", "hybrid", "electrolytic", "film"];

/** Inclusive range check with a little room for decimal literals such as 2.7 + 0.15. */
const within = (x: number, lo: number, hi: number) => x >= lo * (1 - 1e-9) && x <= hi * (1 + 1e-9);

/** Every row failing `check`, by SKU, so a failure names the part. */
function failing<T extends { sku: string }>(rows: T[], check: (row: T) => boolean): string[] {
  return rows.filter((r) => !check(r)).map((r) => r.sku);
}

/** Money column is numeric(14, 4): a plain positive decimal with at most 4 decimals. */
function isMoneyString(s: string): boolean {
  if (!/^\d{1,10}(\.\d{1,4})?$/.test(s)) return false;
  const d = new Decimal(s);
  return d.isFinite() && d.gt(0) && d.decimalPlaces() <= 4;
}

function volumeM3(c: Cell): number {
  const h = c.heightMm / 1000;
  if (c.shape === "cylinder") return Math.PI * ((c.diameterMm ?? 0) / 2000) ** 2 * h;
  return ((c.lengthMm ?? 0) / 1000) * ((c.widthMm ?? 0) / 1000) * h;
}

/*
 * Figures typical of each technology (common practice, as the trade states them on cell
 * datasheets). ESR in Ω, capacitance in F, voltage in V, tolerances in %.
 */
const RANGES: Record<
  Technology,
  {
    capacitanceF: [number, number];
    ratedVoltageV: [number, number];
    surgeOverRated: [number, number];
    esrOhm: [number, number];
    tolerances: [number, number][];
    energyWhPerKg: [number, number];
  }
> = {
  // EDLC: 2.7 V or 3.0 V cells, surge about +0.15 V, tolerance −10/+20 % or −0/+20 %
  edlc: {
    capacitanceF: [1, 3400],
    ratedVoltageV: [2.7, 3.0],
    surgeOverRated: [1.03, 1.07],
    esrOhm: [0.1e-3, 100e-3],
    tolerances: [
      [10, 20],
      [0, 20],
    ],
    energyWhPerKg: [1, 10],
  },
  // lithium-ion capacitor: 3.8 V rated, 4.0 V surge
  hybrid: {
    capacitanceF: [200, 3300],
    ratedVoltageV: [3.8, 3.8],
    surgeOverRated: [4.0 / 3.8, 4.0 / 3.8],
    esrOhm: [0.7e-3, 10e-3],
    tolerances: [
      [10, 20],
      [0, 20],
    ],
    energyWhPerKg: [5, 25],
  },
  // aluminium electrolytic: surge 1.1–1.15 × rated, ±20 %
  electrolytic: {
    capacitanceF: [100e-6, 47e-3],
    ratedVoltageV: [25, 550],
    surgeOverRated: [1.1, 1.15],
    esrOhm: [10e-3, 10],
    tolerances: [[20, 20]],
    energyWhPerKg: [0.01, 1],
  },
  // polypropylene film: surge 1.2–1.5 × rated, ±5 % or ±10 %
  film: {
    capacitanceF: [1e-6, 2e-3],
    ratedVoltageV: [450, 3000],
    surgeOverRated: [1.2, 1.5],
    esrOhm: [0.1e-3, 10e-3],
    tolerances: [
      [5, 5],
      [10, 10],
    ],
    energyWhPerKg: [0.005, 0.5],
  },
};

describe.each(catalogs)("demo catalog of $slug", ({ cells, components }) => {
  const active = cells.filter((c) => c.isActive !== false);

  it("has at least 34 cells, at least 30 active, and a couple inactive", () => {
    expect(cells.length).toBeGreaterThanOrEqual(34);
    expect(active.length).toBeGreaterThanOrEqual(30);
    expect(cells.length - active.length).toBeGreaterThanOrEqual(1);
  });

  it("offers several active cells of each of the four technologies", () => {
    for (const t of TECHNOLOGIES) {
      expect(active.filter((c) => c.technology === t).length, t).toBeGreaterThanOrEqual(3);
    }
  });

  it("has unique SKUs (the schema's per-shop unique index)", () => {
    expect(new Set(cells.map((c) => c.sku)).size).toBe(cells.length);
    expect(new Set(components.map((c) => c.sku)).size).toBe(components.length);
  });

  it("names only the declared invented manufacturers", () => {
    const known = new Set<string>(DEMO_MANUFACTURERS);
    expect(failing(cells, (c) => known.has(c.manufacturer))).toEqual([]);
    expect(failing(cells, (c) => c.series.trim().length > 0)).toEqual([]);
  });

  it("has positive, finite physics figures and non-negative tolerances", () => {
    const positive = (x: number | null | undefined) => typeof x === "number" && Number.isFinite(x) && x > 0;
    expect(
      failing(cells, (c) =>
        [c.capacitanceF, c.ratedVoltageV, c.surgeVoltageV, c.esrOhm, c.leakageCurrentA, c.continuousCurrentA, c.peakCurrentA, c.massKg, c.heightMm].every(
          positive,
        ),
      ),
    ).toEqual([]);
    expect(failing(cells, (c) => c.toleranceMinusPct >= 0 && c.toleranceMinusPct < 100 && c.tolerancePlusPct >= 0)).toEqual([]);
  });

  it("gives the dimensions its shape needs: diameter for cylinders, length and width for boxes", () => {
    expect(
      failing(cells, (c) =>
        c.shape === "cylinder"
          ? (c.diameterMm ?? 0) > 0 && c.lengthMm == null && c.widthMm == null
          : (c.lengthMm ?? 0) > 0 && (c.widthMm ?? 0) > 0 && c.diameterMm == null,
      ),
    ).toEqual([]);
  });

  it("gives every hybrid cell a minimum voltage between 2 V and 2.8 V, and no other cell one (common practice: about 2.2 V)", () => {
    expect(failing(cells, (c) => (c.technology === "hybrid" ? within(c.minVoltageV ?? 0, 2, 2.8) : c.minVoltageV == null))).toEqual([]);
  });

  it("gives every cell life and temperature data in its technology's usual band (common practice, from memory)", () => {
    const top: Record<Technology, [number, number]> = { edlc: [60, 70], hybrid: [70, 85], electrolytic: [85, 105], film: [85, 105] };
    expect(
      failing(cells, (c) => {
        const [lo, hi] = top[c.technology];
        return (
          within(c.maxTemperatureC ?? 0, lo, hi) &&
          (c.minTemperatureC ?? 0) <= -20 &&
          within(c.ratedLifeHours ?? 0, 1000, 100_000) &&
          (c.ratedLifeTemperatureC ?? Infinity) <= (c.maxTemperatureC ?? -Infinity) &&
          // a bare cell in still air: 0.5 to 60 K/W from the largest can to the smallest
          within(c.thermalResistanceKPerW ?? 0, 0.5, 60) &&
          (c.coldCapacitanceFactor == null || within(c.coldCapacitanceFactor, 0.5, 1)) &&
          (c.coldEsrFactor == null || within(c.coldEsrFactor, 1, 10))
        );
      }),
    ).toEqual([]);
  });

  it("rates surge voltage at or above rated voltage", () => {
    expect(failing(cells, (c) => c.surgeVoltageV >= c.ratedVoltageV)).toEqual([]);
  });

  it("keeps each technology's figures in the trade's usual ranges (common practice)", () => {
    const bad = failing(cells, (c) => {
      const r = RANGES[c.technology];
      const energyWhPerKg = (0.5 * c.capacitanceF * c.ratedVoltageV ** 2) / 3600 / c.massKg;
      return (
        within(c.capacitanceF, ...r.capacitanceF) &&
        within(c.ratedVoltageV, ...r.ratedVoltageV) &&
        within(c.surgeVoltageV / c.ratedVoltageV, ...r.surgeOverRated) &&
        within(c.esrOhm, ...r.esrOhm) &&
        r.tolerances.some(([minus, plus]) => c.toleranceMinusPct === minus && c.tolerancePlusPct === plus) &&
        // stored energy per mass at rated voltage, ½·C·V²: typical bands (common practice, from memory)
        within(energyWhPerKg, ...r.energyWhPerKg)
      );
    });
    expect(bad).toEqual([]);
  });

  it("keeps EDLC cells to 2.7 V or 3.0 V, 0.01–0.52 kg, cylinders d 8–60 mm and h 20–140 mm (common practice)", () => {
    const edlc = cells.filter((c) => c.technology === "edlc");
    expect(
      failing(
        edlc,
        (c) =>
          [2.7, 3.0].includes(c.ratedVoltageV) &&
          within(c.massKg, 0.01, 0.52) &&
          (c.shape !== "cylinder" || (within(c.diameterMm ?? 0, 8, 60) && within(c.heightMm, 20, 140))),
      ),
    ).toEqual([]);
  });

  it("asks no cell for more current than its ESR allows into a short circuit (Ohm's law, I = V / R)", () => {
    expect(failing(cells, (c) => c.peakCurrentA <= c.ratedVoltageV / c.esrOhm)).toEqual([]);
    expect(failing(cells, (c) => c.continuousCurrentA <= c.peakCurrentA)).toEqual([]);
  });

  it("has masses that fit the stated size: 800–2500 kg/m³ (common practice: foil, film and electrolyte in a can)", () => {
    expect(failing(cells, (c) => within(c.massKg / volumeM3(c), 800, 2500))).toEqual([]);
  });

  it("prices every cell and component as a decimal string fitting numeric(14, 4)", () => {
    expect(failing(cells, (c) => isMoneyString(c.unitCost))).toEqual([]);
    expect(failing(components, (c) => isMoneyString(c.unitCost))).toEqual([]);
  });

  it("keeps stock at 0–2000 and lead time at 0–70 days, short when well stocked (common practice)", () => {
    const rows = [...cells, ...components];
    const ok = (r: { stock?: number; leadTimeDays?: number }) => {
      const stock = r.stock ?? 0;
      const lead = r.leadTimeDays ?? 0;
      return Number.isInteger(stock) && Number.isInteger(lead) && within(stock, 0, 2000) && lead >= 0 && lead <= 70;
    };
    expect(failing(rows, ok)).toEqual([]);
    expect(failing(cells, (c) => (c.stock ?? 0) < 50 || (c.leadTimeDays ?? 0) <= 14)).toEqual([]);
    expect(cells.some((c) => c.stock === 0)).toBe(true);
  });

  it("has at least 8 components covering every kind, with the specs each kind needs", () => {
    expect(components.length).toBeGreaterThanOrEqual(8);
    for (const kind of ["balancing-board", "interconnect", "terminal", "enclosure", "resistor"] as const) {
      expect(
        components.some((c) => c.kind === kind),
        kind,
      ).toBe(true);
    }
    const num = (x: unknown) => typeof x === "number" && Number.isFinite(x) && x > 0;
    const specsOk = (c: Component) => {
      const s = c.specs ?? {};
      switch (c.kind) {
        case "balancing-board":
          return Number.isInteger(s.channels) && num(s.channels) && num(s.maxCellVoltage);
        case "interconnect":
          return s.perCell === 1;
        case "terminal":
          return num(s.maxCurrentA);
        case "enclosure":
          // IEC 60529 IP code: "IP" + solids digit 0–6 + water digit 0–9
          return num(s.volumeM3) && typeof s.ipRating === "string" && /^IP[0-6][0-9]$/.test(s.ipRating);
        case "resistor":
          return num(s.powerRatingW);
      }
    };
    expect(failing(components, specsOk)).toEqual([]);
  });

  it("has a balancing board for every rated voltage of its active EDLC and hybrid cells", () => {
    const boardVoltages = new Set(components.filter((c) => c.kind === "balancing-board").map((c) => c.specs?.maxCellVoltage));
    const needed = new Set(active.filter((c) => c.technology === "edlc" || c.technology === "hybrid").map((c) => c.ratedVoltageV));
    expect([...needed].filter((v) => !boardVoltages.has(v))).toEqual([]);
  });
});

describe("invented manufacturers", () => {
  it("declares distinct makers, each used by some catalog", () => {
    expect(new Set(DEMO_MANUFACTURERS).size).toBe(DEMO_MANUFACTURERS.length);
    const used = new Set(catalogs.flatMap((c) => c.cells.map((cell) => cell.manufacturer)));
    expect(DEMO_MANUFACTURERS.filter((m) => !used.has(m))).toEqual([]);
  });
});

describe("demo shops and people", () => {
  it("gives each shop a usable address, a currency a shop can open with and an ISO 4217 code, and storefront text", () => {
    // the ISO 4217 codes as the runtime's Intl lists them (ECMA-402 Intl.supportedValuesOf)
    const iso4217 = new Set(Intl.supportedValuesOf("currency"));
    for (const s of demoShops) {
      expect(slugProblem(s.slug), s.slug).toBeNull();
      expect(iso4217.has(s.currency), s.currency).toBe(true);
      expect(SHOP_CURRENCIES as readonly string[]).toContain(s.currency);
      expect(s.tagline.length, s.slug).toBeGreaterThan(10);
      expect(s.description.length, s.slug).toBeGreaterThan(s.tagline.length);
    }
    expect(new Set(demoShops.map((s) => s.slug)).size).toBe(demoShops.length);
  });

  it("gives every demo person a name, address and the demo password that the sign-up form itself accepts", () => {
    const people = Object.values(demoPeople).flatMap((p) => [p.manager, p.estimator, ...p.customers]);
    for (const p of people) expect(joinShopSchema.safeParse({ name: p.name, email: p.email, password: DEMO_PASSWORD }).success, p.email).toBe(true);
  });

  it("gives every person a unique address on a reserved .example domain (RFC 2606)", () => {
    const people = Object.values(demoPeople).flatMap((p) => [p.manager, p.estimator, ...p.customers]);
    expect(people).toHaveLength(8);
    const emails = people.map((p) => p.email);
    expect(new Set(emails).size).toBe(emails.length);
    expect(emails.filter((e) => !/^[a-z]+(\.[a-z]+)*@[a-z0-9-]+\.example$/.test(e))).toEqual([]);
    expect(people.filter((p) => p.name.trim().split(/\s+/).length < 2)).toEqual([]);
  });

  it("puts staff on the shop's own domain and customers at their own companies", () => {
    for (const shop of demoShops) {
      const p = demoPeople[shop.slug];
      const shopDomain = `@${shop.slug}.example`;
      expect(p.manager.email.endsWith(shopDomain), shop.slug).toBe(true);
      expect(p.estimator.email.endsWith(shopDomain), shop.slug).toBe(true);
      for (const c of p.customers) expect(c.email.endsWith(shopDomain), c.email).toBe(false);
    }
  });
});
