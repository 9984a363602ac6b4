"use client";
import { createColumnHelper, type SortingFn } from "@tanstack/react-table";
import { Decimal } from "decimal.js";
import type { PricedOption } from "@/lib/quoting/types";
import { formatMoney } from "@/lib/pricing/currency";
import { formatQuantity } from "@/lib/quantities";
import { failureVerdict, lifeShort } from "@/lib/quoting/option-depth-words";
import { arrangementLabel, TECHNOLOGY_LABELS, TECHNOLOGY_SHORT, TOPOLOGY_LABELS } from "@/lib/vocabulary";

const col = createColumnHelper<PricedOption>();

/** Exact comparison of decimal strings; options without a price go last. */
const byPrice: SortingFn<PricedOption> = (a, b) => {
  const pa = a.original.price?.perBank;
  const pb = b.original.price?.perBank;
  if (!pa || !pb) return pa ? -1 : pb ? 1 : 0;
  return new Decimal(pa).cmp(new Decimal(pb));
};

/** Survival of one failed cell as a number to sort by: both kinds survived first. */
function survivalScore(o: PricedOption): number {
  const s = (v: PricedOption["failures"]["short"]) => (!v.survives ? 0 : v.withinRating ? 2 : 1);
  return s(o.failures.short) * 3 + s(o.failures.open);
}

const VERDICT_MARK = { yes: "✓", "above rating": "!", no: "✗" } as const;
const VERDICT_CLASS = { yes: "text-charge-700", "above rating": "text-hazard-700", no: "text-danger-700" } as const;

/**
 * The options table's columns. A first click sorts each the useful way (cheaper, lighter, smaller,
 * lower ESR, sooner first; more capacitance and energy first); rows that tie keep the price ranking.
 */
export function optionColumns(currency: string) {
  const first = (desc: boolean) => ({ sortDescFirst: desc });
  return [
    col.accessor((o) => o.cell.sku, {
      id: "cell",
      header: "Cell",
      ...first(false),
      cell: (c) => (
        <span>
          <span className="whitespace-nowrap font-mono text-xs font-medium">{c.row.original.cell.sku}</span>
          <span className="block text-xs text-ink-500" title={TECHNOLOGY_LABELS[c.row.original.cell.technology]}>
            {TECHNOLOGY_SHORT[c.row.original.cell.technology]}
          </span>
        </span>
      ),
    }),
    col.accessor((o) => o.seriesCount * 1e6 + o.parallelCount, {
      id: "arrangement",
      header: "Arrangement",
      ...first(false),
      cell: (c) => (
        <span>
          <span className="num whitespace-nowrap font-medium">{arrangementLabel(c.row.original)}</span>
          <span className="block text-xs text-ink-500">{TOPOLOGY_LABELS[c.row.original.topology]}</span>
        </span>
      ),
    }),
    col.accessor("cellCount", { header: "Cells", ...first(false), cell: (c) => <span className="num">{c.getValue()}</span> }),
    col.accessor((o) => o.capacitance.design, {
      id: "capacitance",
      header: "C design",
      ...first(true),
      cell: (c) => <span className="num whitespace-nowrap">{formatQuantity(c.getValue(), "F")}</span>,
    }),
    col.accessor("usableEnergy", {
      header: "Usable energy",
      ...first(true),
      cell: (c) => <span className="num whitespace-nowrap">{formatQuantity(c.getValue(), "J")}</span>,
    }),
    col.accessor((o) => o.esr.endOfLife, {
      id: "esr",
      header: "ESR end of life",
      ...first(false),
      cell: (c) => <span className="num whitespace-nowrap">{formatQuantity(c.getValue(), "Ω")}</span>,
    }),
    col.accessor("mass", { header: "Mass", ...first(false), cell: (c) => <span className="num whitespace-nowrap">{formatQuantity(c.getValue(), "kg")}</span> }),
    col.accessor("volume", {
      header: "Volume",
      ...first(false),
      cell: (c) => <span className="num whitespace-nowrap">{formatQuantity(c.getValue(), "m³")}</span>,
    }),
    col.accessor("leadTimeDays", {
      header: "Lead time",
      ...first(false),
      cell: (c) => <span className="num whitespace-nowrap">{c.getValue() === 0 ? "stock" : `${c.getValue()} d`}</span>,
    }),
    col.accessor((o) => o.price?.perBank ?? null, {
      id: "price",
      header: "Price / bank",
      ...first(false),
      sortingFn: byPrice,
      cell: (c) => {
        const p = c.row.original.price;
        if (!p) return <span className="text-xs text-ink-500">on request</span>;
        return (
          <span className="num whitespace-nowrap font-medium">
            {formatMoney(p.perBank, currency)}
            {p.quantity > 1 ? (
              <span className="block text-xs font-normal text-ink-500">
                {formatMoney(p.amount, currency)} for {p.quantity}
              </span>
            ) : null}
          </span>
        );
      },
    }),
    col.accessor("pareto", {
      header: "Pareto",
      ...first(true),
      cell: (c) =>
        c.getValue() ? (
          <span title="A best trade-off: no other option is cheaper, lighter and smaller at once" className="text-charge-700">
            ◆<span className="sr-only">a best trade-off (on the Pareto set)</span>
          </span>
        ) : null,
    }),
    col.accessor(survivalScore, {
      id: "survives",
      header: "One cell fails",
      ...first(true),
      cell: (c) => {
        const o = c.row.original;
        return (
          <span className="whitespace-nowrap text-xs" data-testid="survives-cell">
            {(["short", "open"] as const).map((mode) => {
              const v = failureVerdict(o.failures[mode]);
              return (
                <span key={mode} className={`mr-2 ${VERDICT_CLASS[v]}`} title={o.failures[mode].text}>
                  {VERDICT_MARK[v]} {mode}
                  <span className="sr-only">: {v}</span>
                </span>
              );
            })}
          </span>
        );
      },
    }),
    col.accessor((o) => o.life?.lifeYears ?? -1, {
      id: "life",
      header: "Life",
      ...first(true),
      cell: (c) => (
        <span
          className="num whitespace-nowrap"
          title={c.row.original.life ? `${c.row.original.life.cellTemperature.toFixed(0)} °C cell temperature` : "no life data"}
        >
          {lifeShort(c.row.original.life)}
        </span>
      ),
    }),
  ];
}
