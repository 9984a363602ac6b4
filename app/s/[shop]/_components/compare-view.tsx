"use client";
import { Button } from "@/components/ui/button";
import type { Requirement } from "@/lib/bank";
import type { OptionYield } from "@/lib/bank/option-yield";
import { formatMoney } from "@/lib/pricing/currency";
import { formatDuration, formatQuantity as q } from "@/lib/quantities";
import { failureVerdict, lifeHeadline } from "@/lib/quoting/option-depth-words";
import type { PricedOption } from "@/lib/quoting/types";
import { optionId } from "@/lib/validation/quote";
import { arrangementLabel, describeRequirement, TECHNOLOGY_SHORT, TOPOLOGY_LABELS } from "@/lib/vocabulary";
import styles from "./compare-view.module.css";
import { useOptionYields } from "./use-option-yield";

/** One row of the comparison: what it shows, and (for figures) which way is better. */
interface CompareRow {
  group: string;
  label: string;
  value: (o: PricedOption, y: OptionYield | null) => string;
  /** a number to find the best column by; null when the column has none */
  score?: (o: PricedOption, y: OptionYield | null) => number | null;
  better?: "low" | "high";
}

const pct = (x: number) => `${Number((x * 100).toFixed(1))} %`;

function rowsFor(currency: string): CompareRow[] {
  const price = (o: PricedOption) => (o.price ? Number(o.price.perBank) : null);
  return [
    { group: "Bank", label: "Cell", value: (o) => `${o.cell.sku} (${TECHNOLOGY_SHORT[o.cell.technology]})` },
    { group: "Bank", label: "Arrangement", value: (o) => `${arrangementLabel(o)}, ${TOPOLOGY_LABELS[o.topology].toLowerCase()}` },
    { group: "Bank", label: "Cells", value: (o) => String(o.cellCount), score: (o) => o.cellCount, better: "low" },
    { group: "Bank", label: "Capacitance (design)", value: (o) => q(o.capacitance.design, "F"), score: (o) => o.capacitance.design, better: "high" },
    { group: "Bank", label: "Usable energy (end of life)", value: (o) => q(o.usableEnergy, "J"), score: (o) => o.usableEnergy, better: "high" },
    { group: "Bank", label: "ESR (end of life)", value: (o) => q(o.esr.endOfLife, "Ω"), score: (o) => o.esr.endOfLife, better: "low" },
    {
      group: "Bank",
      label: "Worst-case cell voltage",
      value: (o) => `${q(o.worstCellVoltage, "V")} of ${q(o.cell.ratedVoltage, "V")}`,
      score: (o) => o.worstCellVoltage / o.cell.ratedVoltage,
      better: "low",
    },
    { group: "Bank", label: "Mass", value: (o) => q(o.mass, "kg"), score: (o) => o.mass, better: "low" },
    { group: "Bank", label: "Volume", value: (o) => q(o.volume, "m³"), score: (o) => o.volume, better: "low" },
    {
      group: "Bank",
      label: `Time to the safe voltage`,
      value: (o) => (o.discharge.secondsToSafe === 0 ? "works below it" : formatDuration(o.discharge.secondsToSafe)),
      score: (o) => o.discharge.secondsToSafe,
      better: "low",
    },
    {
      group: "One failed cell",
      label: "Survives one shorted cell",
      value: (o) => failureVerdict(o.failures.short),
      score: (o) => rankVerdict(o.failures.short),
      better: "high",
    },
    {
      group: "One failed cell",
      label: "Survives one open cell",
      value: (o) => failureVerdict(o.failures.open),
      score: (o) => rankVerdict(o.failures.open),
      better: "high",
    },
    {
      group: "Tolerance yield",
      label: "Meet the requirement at end of life",
      value: (_o, y) => (y === null ? "…" : y.shares.meetingRequirement === null ? "—" : pct(y.shares.meetingRequirement)),
      score: (_o, y) => y?.shares.meetingRequirement ?? null,
      better: "high",
    },
    {
      group: "Tolerance yield",
      label: "Every cell within surge",
      value: (_o, y) => (y === null ? "…" : pct(y.shares.withinSurge)),
      score: (_o, y) => y?.shares.withinSurge ?? null,
      better: "high",
    },
    { group: "Temperature and life", label: "Expected life", value: (o) => lifeHeadline(o.life), score: (o) => o.life?.lifeYears ?? null, better: "high" },
    {
      group: "Temperature and life",
      label: "Cell temperature",
      value: (o) => (o.life ? `${Number(o.life.cellTemperature.toFixed(1))} °C` : "—"),
      score: (o) => o.life?.cellTemperature ?? null,
      better: "low",
    },
    {
      group: "Handling",
      label: "Never below",
      value: (o) => (o.handling.floorVoltage === null ? "0 V (may be shorted when discharged)" : q(o.handling.floorVoltage, "V")),
    },
    {
      group: "Handling",
      label: "Standing heat",
      value: (o) => `${q(o.handling.standingHeat.watts, "W")}${o.handling.standingHeat.significant ? " — significant" : ""}`,
      score: (o) => o.handling.standingHeat.watts,
      better: "low",
    },
    {
      group: "Price",
      label: "Lead time",
      value: (o) => (o.leadTimeDays === 0 ? "from stock" : `${o.leadTimeDays} days`),
      score: (o) => o.leadTimeDays,
      better: "low",
    },
    { group: "Price", label: "Price per bank", value: (o) => (o.price ? formatMoney(o.price.perBank, currency) : "on request"), score: price, better: "low" },
    { group: "Price", label: "Total", value: (o) => (o.price ? formatMoney(o.price.amount, currency) : "on request") },
  ];
}

function rankVerdict(v: PricedOption["failures"]["short"]): number {
  return !v.survives ? 0 : v.withinRating ? 2 : 1;
}

/**
 * Two to four options side by side: figures, failure behaviour, yield, life and price, with the
 * rows that differ highlighted and the best value of each figure marked. Printable: printing
 * prints only this sheet. Loaded on demand (next/dynamic), so the storefront's first load stays small.
 */
export default function CompareView({
  options,
  requirement,
  currency,
  onRemove,
  onClose,
}: {
  options: PricedOption[];
  requirement: Requirement;
  currency: string;
  onRemove: (id: string) => void;
  onClose: () => void;
}) {
  const yields = useOptionYields(options, requirement);
  const rows = rowsFor(currency);
  let group = "";
  return (
    <section
      id="compare-sheet"
      aria-labelledby="compare-title"
      className={`${styles.sheet} rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-100 sm:p-6`}
      data-testid="compare-view"
    >
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h3 id="compare-title" className="text-lg font-semibold">
            {options.length} arrangements side by side
          </h3>
          <p className="text-sm text-ink-600">
            Rows that differ are shaded; <strong className="font-semibold text-charge-700">◆</strong> marks the best of each figure.
          </p>
        </div>
        <div className={`flex gap-2 ${styles.noPrint}`}>
          <Button type="button" variant="secondary" onClick={() => window.print()}>
            Print
          </Button>
          <Button type="button" variant="quiet" onClick={onClose}>
            Close
          </Button>
        </div>
      </div>
      <div className="scroll-cue mt-4" role="region" aria-label="Comparison table (scrolls sideways on a narrow screen)" tabIndex={0}>
        <table className="w-full min-w-[36rem] border-collapse text-left text-sm">
          <caption className="sr-only">Chosen arrangements compared row by row</caption>
          <thead>
            <tr className="border-b border-ink-200">
              <th scope="col" className="sticky left-0 bg-white px-2 py-2 text-xs font-medium uppercase tracking-wide text-ink-500">
                <span className="sr-only">Figure</span>
              </th>
              {options.map((o) => (
                <th key={optionId(o)} scope="col" className="px-2 py-2 align-top">
                  <span className="block font-mono text-xs font-semibold">{o.cell.sku}</span>
                  <span className="num block font-medium">{arrangementLabel(o)}</span>
                  <button
                    type="button"
                    className={`mt-1 text-xs text-ink-500 underline hover:text-ink-800 ${styles.noPrint}`}
                    onClick={() => onRemove(optionId(o))}
                  >
                    Remove
                  </button>
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.flatMap((row) => {
              const values = options.map((o, i) => row.value(o, yields[i] ?? null));
              const differs = new Set(values).size > 1;
              const scores = row.score ? options.map((o, i) => row.score?.(o, yields[i] ?? null) ?? null) : [];
              const known = scores.filter((s): s is number => s !== null);
              const best = known.length > 1 && differs ? (row.better === "low" ? Math.min(...known) : Math.max(...known)) : null;
              const out = [];
              if (row.group !== group) {
                group = row.group;
                out.push(
                  <tr key={`g-${group}`}>
                    <th colSpan={options.length + 1} scope="colgroup" className="px-2 pb-1 pt-4 text-xs font-semibold uppercase tracking-wide text-ink-500">
                      {group}
                    </th>
                  </tr>,
                );
              }
              out.push(
                <tr key={row.label} className={`border-t border-ink-100 ${differs ? "bg-copper-50" : ""}`} data-differs={differs ? "true" : undefined}>
                  <th scope="row" className={`sticky left-0 px-2 py-1.5 font-normal text-ink-600 ${differs ? "bg-copper-50" : "bg-white"}`}>
                    {row.label}
                    {differs ? <span className="sr-only"> (differs)</span> : null}
                  </th>
                  {values.map((v, i) => {
                    const isBest = best !== null && scores[i] === best;
                    return (
                      <td key={i} className={`num px-2 py-1.5 align-top ${isBest ? "font-semibold text-charge-700" : "text-ink-900"}`}>
                        {v}
                        {isBest ? (
                          <span aria-label="best" className="ml-1">
                            ◆
                          </span>
                        ) : null}
                      </td>
                    );
                  })}
                </tr>,
              );
              return out;
            })}
          </tbody>
        </table>
      </div>
      <p className="mt-3 text-xs text-ink-600">
        For {describeRequirement(requirement)}. These figures are an engineering estimate; local electrical codes and licensed practice decide.
      </p>
    </section>
  );
}
