import { formatQuantity } from "../quantities";
import type { Technology } from "./types";

/**
 * Each technology's own limits and handling (DESIGN §3.2, §6): the minimum cell voltage of hybrid
 * cells and the standby drain that must not pass it, the standing heat of the balancing resistors
 * in their enclosure, the cautions for handling and the notes for shipping.
 */

/** The usual minimum of a hybrid (lithium-ion) capacitor cell (V): common practice, from memory; the catalog gives each cell's own. */
export const TYPICAL_HYBRID_MIN_VOLTAGE = 2.2;

const SECONDS_PER_DAY = 86_400;

function fmt(value: number, unit: string): string {
  return formatQuantity(value, unit);
}

export interface StandbyDrainInput {
  /** cell voltage when the bank is switched off (V): V_max/N_s */
  startVoltage: number;
  /** the cell's minimum voltage (V) */
  minVoltage: number;
  /** one cell's capacitance (F) */
  capacitance: number;
  /** one cell's leakage current (A), drawn as a constant current (the safe side: it falls with the voltage) */
  leakageCurrent: number;
  /** the balancing resistor across the cell's position (Ω), null when none is fitted */
  resistance: number | null;
  /** cells that share one resistor: N_p in parallel groups, 1 in series strings */
  cellsPerResistor: number;
}

/**
 * Seconds until a switched-off bank's cells drain from their working voltage to their minimum
 * through the balancing resistor and their own leakage. Each cell sees R·n (n cells share one
 * resistor) and its leakage I: C·dV/dt = −V/(R·n) − I, so
 * t = R·n·C·ln((V₀ + I·R·n) / (V_min + I·R·n)); without a resistor t = C·(V₀ − V_min)/I.
 * Infinity when nothing drains the cell; 0 when it starts at or below its minimum.
 */
export function standbyDrainSeconds(input: StandbyDrainInput): number {
  const { startVoltage: v0, minVoltage: vMin, capacitance: c, leakageCurrent } = input;
  if (!(v0 > vMin)) return 0;
  const leak = leakageCurrent > 0 ? leakageCurrent : 0;
  if (input.resistance === null || !(input.resistance > 0)) return leak > 0 ? (c * (v0 - vMin)) / leak : Infinity;
  const rn = input.resistance * Math.max(1, input.cellsPerResistor);
  const offset = leak * rn;
  return rn * c * Math.log((v0 + offset) / (vMin + offset));
}

export interface StandbyCheck {
  /** time for a switched-off bank's cells to drain from V_max/N_s to their minimum (s); null when it never gets there */
  seconds: number | null;
  /** the shop's standby time the cells must outlast (s) */
  requiredSeconds: number;
  /** the drain is faster: the balancing circuit needs a disconnect that opens while the bank stands idle */
  needsDisconnect: boolean;
}

/** The standby drain checked against the shop's standby time (days). */
export function checkStandby(input: StandbyDrainInput, standbyDays: number): StandbyCheck {
  const seconds = standbyDrainSeconds(input);
  const requiredSeconds = standbyDays * SECONDS_PER_DAY;
  return { seconds: Number.isFinite(seconds) ? seconds : null, requiredSeconds, needsDisconnect: seconds < requiredSeconds };
}

/**
 * Standing heat in a closed enclosure. The rule (common practice for a first check, values from
 * memory): the cells take about half of the enclosure's volume; the enclosure is taken as a cube
 * of that volume, which sheds heat from its six faces at about 5.5 W/(m²·K) in still air (natural
 * convection and radiation from a painted metal case); the air inside rises by
 * ΔT = P / (h·A). A rise of 5 K or more is significant: life halves for each 10 K (the 10 °C rule).
 * Example: 60 W inside 8 L → A = 0.24 m², ΔT ≈ 45 K.
 */
export const ENCLOSURE_FILL = 0.5;
export const ENCLOSURE_HEAT_TRANSFER = 5.5;
export const SIGNIFICANT_HEAT_RISE_K = 5;

export interface StandingHeat {
  /** continuous dissipation of the balancing resistors and any continuous bleeder (W) */
  watts: number;
  /** the enclosure the rule assumes (m³) */
  enclosureVolume: number;
  /** its surface (m²) */
  surface: number;
  /** the air's rise above ambient (K) */
  temperatureRise: number;
  significant: boolean;
}

/** The rule above for `watts` dissipated by a bank whose cells take `cellVolume` (m³); a given enclosure volume overrides the estimate. */
export function standingHeat(watts: number, cellVolume: number, enclosureVolume?: number): StandingHeat {
  const volume = enclosureVolume ?? cellVolume / ENCLOSURE_FILL;
  const surface = 6 * Math.cbrt(volume) ** 2;
  const temperatureRise = watts > 0 && surface > 0 ? watts / (ENCLOSURE_HEAT_TRANSFER * surface) : 0;
  return { watts, enclosureVolume: volume, surface, temperatureRise, significant: temperatureRise >= SIGNIFICANT_HEAT_RISE_K };
}

/** The warning for significant standing heat, with the rule's figures. */
export function standingHeatWarning(h: StandingHeat, withBleeder: boolean): string {
  const litres = h.enclosureVolume * 1000;
  return `Standing heat: the balancing resistors${withBleeder ? " and the bleeder" : ""} dissipate ${fmt(h.watts, "W")} whenever the bank is charged; inside a closed case of about ${Number(litres.toPrecision(2))} L (${Number(h.surface.toPrecision(2))} m² at ${ENCLOSURE_HEAT_TRANSFER} W/m²·K, common practice) the air runs about ${Math.round(h.temperatureRise)} K above ambient. Vent the case, mount the resistors outside it, or use active balancing.`;
}

/**
 * The energy that decides a capacitor's transport class, per cell (Wh). From the UN
 * Recommendations on the Transport of Dangerous Goods, Model Regulations, special provisions 361
 * (electric double-layer: ½·C_N·U_R²) and 372 (asymmetric: ½·C_N·(U_R² − U_L²), U_L the rated
 * lower limit voltage), as reproduced in US 49 CFR §172.102. Both put the threshold at 0.3 Wh.
 */
export const TRANSPORT_THRESHOLD_WH = 0.3;

export function transportEnergyWh(cell: { technology: Technology; capacitance: number; ratedVoltage: number; minVoltage?: number | null }): number {
  const lower = cell.technology === "hybrid" ? (cell.minVoltage ?? 0) : 0;
  return (0.5 * cell.capacitance * (cell.ratedVoltage ** 2 - lower ** 2)) / 3600;
}

function wh(x: number): string {
  return `${Number(x.toPrecision(3))} Wh`;
}

/**
 * Shipping notes per technology. Sources: UN Model Regulations special provisions 361 (UN 3499,
 * capacitor, electric double layer) and 372 (UN 3508, capacitor, asymmetric), both class 9 above
 * 0.3 Wh per capacitor (text as reproduced in 49 CFR §172.102). The air conditions (UN 3499
 * uncharged with a metal strap across the terminals; UN 3508 protected against short circuit) are
 * from a secondary summary of the ICAO/IATA instructions, and that aluminium electrolytic and film
 * capacitors are not dangerous goods is recalled from memory: the carrier's current rules decide.
 */
export function shippingNotes(cell: { technology: Technology; capacitance: number; ratedVoltage: number; minVoltage?: number | null }): string[] {
  const energy = transportEnergyWh(cell);
  const check = "Check the current edition of the dangerous-goods rules and the carrier's own before shipping.";
  switch (cell.technology) {
    case "edlc":
      return energy > TRANSPORT_THRESHOLD_WH
        ? [
            `Transport: each cell stores ${wh(energy)} (½·C·V², rated), above 0.3 Wh, so the cells and the bank ship as UN 3499, capacitor, electric double layer, class 9 (UN Model Regulations special provision 361); by air each capacitor or module goes uncharged with a metal strap across its terminals. ${check}`,
          ]
        : [`Transport: each cell stores ${wh(energy)} (½·C·V², rated), not above 0.3 Wh: not dangerous goods under special provision 361 (UN 3499). ${check}`];
    case "hybrid":
      return energy > TRANSPORT_THRESHOLD_WH
        ? [
            `Transport: each cell stores ${wh(energy)} between its rated and minimum voltage (½·C·(V_r² − V_min²)), above 0.3 Wh, so the cells and the bank ship as UN 3508, capacitor, asymmetric, class 9 (UN Model Regulations special provision 372), protected against short circuit, partly charged as the maker specifies. ${check}`,
          ]
        : [
            `Transport: each cell stores ${wh(energy)} between its rated and minimum voltage, not above 0.3 Wh: not dangerous goods under special provision 372 (UN 3508); ship partly charged, protected against short circuit. ${check}`,
          ];
    case "electrolytic":
    case "film":
      return [
        `Transport: ${cell.technology === "film" ? "film" : "aluminium electrolytic"} capacitors are not dangerous goods for transport (recalled from memory); ship the bank discharged with a shorting link across its terminals. ${check}`,
      ];
  }
}

export interface CautionInput {
  technology: Technology;
  /** the bank's working voltage (V) */
  maxVoltage: number;
  safeVoltage: number;
  storedEnergy: number;
  /** the stored energy above which the burn and arc caution shows (J) */
  highEnergy: number;
  /** N_s × the cell's minimum voltage (V), for cells that have one */
  floorVoltage: number | null;
  minCellVoltage: number | null;
}

/**
 * The handling cautions of a bank, technology by technology (DESIGN §6): discharge and short the
 * terminals before handling is right for EDLC, electrolytic and film banks; hybrid cells must
 * never be shorted nor taken below their minimum voltage, and ship partly charged.
 */
export function technologyCautions(c: CautionInput): string[] {
  const cautions: string[] = [];
  if (c.maxVoltage > c.safeVoltage) {
    cautions.push(`Shock hazard: the bank works at up to ${fmt(c.maxVoltage, "V")}, above the ${fmt(c.safeVoltage, "V")} safe voltage.`);
  }
  if (c.storedEnergy > c.highEnergy) {
    cautions.push(`Burn and arc hazard: the bank stores about ${fmt(c.storedEnergy, "J")} at ${fmt(c.maxVoltage, "V")}.`);
  }
  if (c.technology === "hybrid") {
    const floor = c.floorVoltage ?? 0;
    const perCell = c.minCellVoltage ?? TYPICAL_HYBRID_MIN_VOLTAGE;
    cautions.push(
      `Hybrid lithium-ion cells: never short the terminals and never discharge the bank below ${fmt(floor, "V")} (${fmt(perCell, "V")} per cell): the cells are damaged, and a short can overheat them. The bank stays charged after the supply is removed: handle it as live, with insulated tools and the terminal covers fitted.`,
    );
    if (floor > c.safeVoltage) {
      cautions.push(
        `The bank cannot be brought below the ${fmt(c.safeVoltage, "V")} safe voltage without harming its cells (it must stay above ${fmt(floor, "V")}): isolate it with a disconnect and treat its terminals as live whenever it is installed or moved.`,
      );
    }
    cautions.push("Ships partly charged, as the cell maker specifies, never shorted: terminals insulated and covered.");
  } else {
    cautions.push(
      "A charged bank keeps its energy after the supply is removed: discharge it and short its terminals before handling.",
      "Ship discharged, with a shorting link fitted across the terminals.",
    );
  }
  cautions.push("These figures are an engineering estimate; local electrical codes and licensed practice decide.");
  return cautions;
}
