/**
 * An option's failures, life, handling and tolerance yield in words and labelled rows: one
 * wording for the storefront, the side-by-side comparison, the quote page and the quote PDF.
 * Pure (no database, no framework): client components import it too.
 */
import type { ArrangementOption, OptionFailureVerdict, OptionLife } from "@/lib/bank";
import type { OptionYield } from "@/lib/bank/option-yield";
import { formatDuration, formatQuantity as q } from "@/lib/quantities";
import type { LabelledValue } from "@/lib/vocabulary";

/** What the words read of an option; every part may be missing on a revision frozen before it existed. */
export type DepthOption = Partial<Pick<ArrangementOption, "failures" | "life" | "handling" | "yieldBasis">> & Pick<ArrangementOption, "cell">;

const degrees = (x: number) => `${Number(x.toFixed(1))} °C`;
const percent = (share: number) => `${Number((share * 100).toFixed(share > 0.999 && share < 1 ? 2 : 1))} %`;

/** "Survives one shorted cell: yes" / "… no" / "… yes, above rating": the verdict alone, for tables. */
export function failureVerdict(v: OptionFailureVerdict): "yes" | "above rating" | "no" {
  return !v.survives ? "no" : v.withinRating ? "yes" : "above rating";
}

/** The two verdicts in words ("Survives one shorted cell: no — …"), or null on a revision frozen without them. */
export function failureLines(o: DepthOption): { short: string; open: string } | null {
  return o.failures ? { short: o.failures.short.text, open: o.failures.open.text } : null;
}

/** Expected life in a few words: "8.9 years", "20 years or more (the ceiling)", "no life data". */
export function lifeHeadline(life: OptionLife | null | undefined): string {
  if (!life) return "no life data in the catalog";
  if (life.lifeYears === null) return life.refusal ?? "cannot run there";
  const years = life.lifeYears >= 10 ? life.lifeYears.toFixed(0) : life.lifeYears.toFixed(1);
  return life.capped ? `${years} years or more (the shop's ceiling)` : `about ${years} years`;
}

/** Years as a table cell: "8.9 y", "≥ 20 y", "—". */
export function lifeShort(life: OptionLife | null | undefined): string {
  if (!life || life.lifeYears === null) return "—";
  const years = life.lifeYears >= 10 ? life.lifeYears.toFixed(0) : life.lifeYears.toFixed(1);
  return life.capped ? `≥ ${years} y` : `${years} y`;
}

/** Temperature and life as labelled rows (the assumptions come apart, as a list). */
export function lifeRows(life: OptionLife): LabelledValue[] {
  const rows: LabelledValue[] = [
    { label: "Expected life", value: lifeHeadline(life) },
    { label: "Ambient", value: `${degrees(life.ambientTemperature)}${life.ambientAssumed ? " (assumed)" : ""}` },
    { label: "Each cell works at", value: `${q(life.cellVoltage, "V")}, ${q(life.cellRmsCurrent, "A")} rms` },
    { label: "Self-heating", value: `${Number(life.selfHeating.toPrecision(2))} K (${q(life.dissipation, "W")} per cell)` },
    { label: "Cell temperature", value: `${degrees(life.cellTemperature)} of ${degrees(life.maxTemperature)} at most` },
  ];
  if (life.cold) {
    const parts: string[] = [];
    if (life.cold.capacitance !== null) parts.push(q(life.cold.capacitance, "F"));
    if (life.cold.esr !== null) parts.push(`ESR ${q(life.cold.esr, "ohm")}`);
    if (parts.length > 0)
      rows.push({ label: `Bank at ${life.cold.temperature !== null ? degrees(life.cold.temperature) : "the cold end"}`, value: parts.join(", ") });
  }
  return rows;
}

/** Limits and handling as labelled rows, and the shipping notes. */
export function handlingRows(o: DepthOption): { rows: LabelledValue[]; shipping: string[] } {
  const h = o.handling;
  if (!h) return { rows: [], shipping: [] };
  const rows: LabelledValue[] = [];
  if (h.minCellVoltage !== null && h.floorVoltage !== null) {
    rows.push({ label: "Never below", value: `${q(h.floorVoltage, "V")} (${q(h.minCellVoltage, "V")} per cell)` });
  }
  if (h.standby) {
    rows.push({
      label: "Switched off, cells reach their minimum after",
      value: h.standby.seconds === null ? "never" : `${formatDuration(h.standby.seconds)}${h.standby.needsDisconnect ? " — needs a disconnect" : ""}`,
    });
  }
  rows.push({
    label: "Standing heat",
    value:
      h.standingHeat.watts > 0
        ? `${q(h.standingHeat.watts, "W")}, about ${Math.round(h.standingHeat.temperatureRise)} K in a closed case${h.standingHeat.significant ? " — significant" : ""}`
        : "none",
  });
  return { rows, shipping: h.shipping };
}

/** The tolerance yield in words, and its figures as rows. */
export function yieldRows(y: OptionYield, o: DepthOption): { headline: string; rows: LabelledValue[] } {
  const basis = o.yieldBasis;
  const spread = basis
    ? `${basis.distribution === "uniform" ? "uniform" : "normal with the tolerance as three standard deviations"} within the cell's −${percent(o.cell.toleranceMinus)}/+${percent(o.cell.tolerancePlus)}, graded to ±${percent(basis.matchingTolerance)}`
    : "";
  const rows: LabelledValue[] = [
    { label: "Capacitance, 1st–99th percentile", value: `${q(y.capacitance.p01, "F")} – ${q(y.capacitance.p99, "F")} (median ${q(y.capacitance.p50, "F")})` },
    { label: "Highest cell voltage while charging, 99th percentile", value: q(y.maxCellVoltage.p99, "V") },
    { label: "Banks with every cell within surge", value: percent(y.shares.withinSurge) },
    { label: "Banks with every cell within rating", value: percent(y.shares.withinRating) },
  ];
  if (y.shares.meetingRequirement !== null && y.requiredCapacitance !== null) {
    rows.unshift({
      label: `Banks meeting the requirement at end of life (at least ${q(y.requiredCapacitance, "F")} when new)`,
      value: percent(y.shares.meetingRequirement),
    });
  }
  rows.push({ label: "Samples", value: `${y.samples.toLocaleString("en-GB")}, seed ${y.seed}${spread ? `; ${spread}` : ""}` });
  const headline =
    y.shares.meetingRequirement !== null
      ? `${percent(y.shares.meetingRequirement)} of banks meet the requirement at end of life; ${percent(y.shares.withinSurge)} keep every cell within surge.`
      : `${percent(y.shares.withinSurge)} of banks keep every cell within surge while charging.`;
  return { headline, rows };
}

/** Whether the yield can be computed for an option as frozen (revisions made before it existed cannot). */
export function hasYieldBasis(o: DepthOption): o is DepthOption & Pick<ArrangementOption, "yieldBasis"> {
  return o.yieldBasis !== undefined;
}
