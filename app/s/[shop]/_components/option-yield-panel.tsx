"use client";
import { FigureRows } from "@/components/bank-depth/figure-rows";
import { YieldHistogram } from "@/components/bank-depth/yield-histogram";
import type { Requirement } from "@/lib/bank";
import { yieldRows } from "@/lib/quoting/option-depth-words";
import type { PricedOption } from "@/lib/quoting/types";
import { useOptionYield } from "./use-option-yield";

/**
 * The focused option's tolerance yield as a histogram (loaded only when an option is focused, so
 * the storefront's first load stays small).
 */
export default function OptionYieldPanel({ option, requirement }: { option: PricedOption; requirement: Requirement }) {
  const y = useOptionYield(option, requirement);
  return (
    <section aria-labelledby="yield-title" className="space-y-2 text-sm" data-testid="yield-panel">
      <h4 id="yield-title" className="text-xs font-semibold uppercase tracking-wide text-ink-500">
        Tolerance yield
      </h4>
      {y === null ? (
        <div className="h-40 animate-pulse rounded bg-ink-50" aria-label="Working out the tolerance yield" role="status" />
      ) : (
        <YieldOutcome option={option} y={y} />
      )}
    </section>
  );
}

function YieldOutcome({ option, y }: { option: PricedOption; y: NonNullable<ReturnType<typeof useOptionYield>> }) {
  const { headline, rows } = yieldRows(y, option);
  return (
    <>
      <p className="font-medium text-ink-900" data-testid="yield-headline">
        {headline}
      </p>
      <figure>
        <YieldHistogram bins={y.histogram.capacitance} required={y.requiredCapacitance} label={`Capacitance of ${y.samples} sampled banks. ${headline}`} />
        <figcaption className="text-xs text-ink-600">
          Capacitance of {y.samples.toLocaleString("en-GB")} banks with their cells drawn within tolerance (new cells); bars below the need are shaded.
        </figcaption>
      </figure>
      <FigureRows rows={rows} />
    </>
  );
}
