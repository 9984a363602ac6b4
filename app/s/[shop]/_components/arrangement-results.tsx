"use client";
import dynamic from "next/dynamic";
import { useDeferredValue, useEffect, useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { BankDiagram } from "@/components/bank-diagram/bank-diagram";
import {
  LazyCellVoltageChart as CellVoltageChart,
  LazyDischargeChart as DischargeChart,
  LazyPriceMassChart as PriceMassChart,
} from "@/components/charts/lazy-charts";
import { formatMoney } from "@/lib/pricing/currency";
import { formatQuantity as q } from "@/lib/quantities";
import { optionId } from "@/lib/validation/quote";
import { arrangementLabel, describeRequirement, reasonWords, TOPOLOGY_LABELS } from "@/lib/vocabulary";
import type { ExploreResult } from "../actions";
import { ChoosePanel } from "./choose-panel";
import { OptionDepthPanel } from "./option-depth-panel";
import { OptionGlossary } from "./option-glossary";
import { OptionCautions, OptionFigures } from "./option-figures";
import { MAX_COMPARED, OptionTable } from "./option-table";
import type { Viewer } from "./viewer";

// The yield (the engine's Monte-Carlo) and the comparison load only when they are wanted.
const OptionYieldPanel = dynamic(() => import("./option-yield-panel"), {
  ssr: false,
  loading: () => <div className="h-48 animate-pulse rounded bg-ink-50" aria-hidden="true" />,
});
const CompareView = dynamic(() => import("./compare-view"), {
  ssr: false,
  loading: () => <div className="h-96 animate-pulse rounded-lg bg-white ring-1 ring-ink-100" aria-hidden="true" />,
});

export function ArrangementResults({
  slug,
  viewer,
  result,
  focus,
  attachmentIds,
  onFocus,
  onBeforeSignIn,
  onQuoted,
}: {
  slug: string;
  viewer: Viewer;
  result: ExploreResult;
  focus: string | null;
  attachmentIds: string[];
  onFocus: (id: string) => void;
  onBeforeSignIn: (focus: string | null) => void;
  onQuoted: () => void;
}) {
  const { options, requirement, currency, designFactors } = result;
  const focused = options.find((o) => optionId(o) === focus) ?? options[0] ?? null;
  // The table shows first; the diagram and charts render just after, at lower priority.
  const shown = useDeferredValue(focused, null);
  const [picked, setPicked] = useState<string[]>([]);
  const [comparing, setComparing] = useState(false);
  const compareRef = useRef<HTMLDivElement>(null);
  // picks that a new search no longer offers fall away
  const ids = new Set(options.map(optionId));
  const compare = picked.filter((p) => ids.has(p));
  const compared = compare.map((p) => options.find((o) => optionId(o) === p)).filter((o): o is (typeof options)[number] => o !== undefined);
  const showCompare = comparing && compared.length >= 2;
  useEffect(() => {
    if (showCompare) compareRef.current?.scrollIntoView({ behavior: "smooth", block: "start" });
  }, [showCompare]);

  if (!focused) {
    return (
      <section aria-labelledby="results" className="space-y-4 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-100">
        <h2 id="results" className="text-xl font-semibold">
          No arrangement from stock fits
        </h2>
        <p className="text-sm text-ink-600">For {describeRequirement(requirement)}:</p>
        <ul className="list-disc space-y-1 pl-5 text-sm text-ink-800" data-testid="no-fit-reasons">
          {result.reasons.map((r) => (
            <li key={r}>{reasonWords(r)}</li>
          ))}
        </ul>
        <p className="text-sm text-ink-600">The shop&apos;s estimators can look at it: they may order other cells or suggest a change.</p>
        <ChoosePanel
          slug={slug}
          viewer={viewer}
          choiceId="review"
          option={null}
          requirement={requirement}
          notes={result.notes}
          attachmentIds={attachmentIds}
          onBeforeSignIn={() => onBeforeSignIn(null)}
          onQuoted={onQuoted}
        />
      </section>
    );
  }

  const id = optionId(focused);
  const shownId = shown ? optionId(shown) : id;
  return (
    <section aria-labelledby="results" className="space-y-6">
      <div>
        <h2 id="results" className="text-xl font-semibold">
          {options.length} arrangement{options.length === 1 ? "" : "s"} from stock
        </h2>
        <p className="text-sm text-ink-600">
          For {describeRequirement(requirement)}. Ranked by {requirement.rankBy === "life" ? "expected life" : "price"}; choose a row to see it drawn and
          charted.
        </p>
      </div>
      <OptionTable
        options={options}
        currency={currency}
        focus={id}
        rankedBy={requirement.rankBy === "life" ? "life" : "price"}
        onFocus={onFocus}
        compare={compare}
        onCompareChange={(optionKey, on) =>
          setPicked((now) => (on ? [...now.filter((p) => ids.has(p)), optionKey].slice(0, MAX_COMPARED) : now.filter((p) => p !== optionKey)))
        }
      />
      <OptionGlossary />
      <div className="flex flex-wrap items-center gap-3 text-sm" data-testid="compare-bar">
        <p className="text-ink-600">
          {compare.length === 0
            ? `Tick two to ${MAX_COMPARED} rows to compare them side by side.`
            : `${compare.length} picked for comparison${compare.length >= MAX_COMPARED ? " (the most at once)" : ""}.`}
        </p>
        <Button type="button" variant="secondary" disabled={compare.length < 2} onClick={() => setComparing(true)}>
          Compare {compare.length >= 2 ? compare.length : ""} side by side
        </Button>
        {compare.length > 0 ? (
          <Button
            type="button"
            variant="quiet"
            onClick={() => {
              setPicked([]);
              setComparing(false);
            }}
          >
            Clear
          </Button>
        ) : null}
      </div>
      <div ref={compareRef} className="scroll-mt-4">
        {showCompare ? (
          <CompareView
            options={compared}
            requirement={requirement}
            currency={currency}
            onRemove={(optionKey) => setPicked((now) => now.filter((p) => p !== optionKey))}
            onClose={() => setComparing(false)}
          />
        ) : null}
      </div>

      {shown === null ? (
        <div className="h-96 animate-pulse rounded-lg bg-white ring-1 ring-ink-100" aria-hidden="true" />
      ) : (
        <>
          <article aria-labelledby="focused" className="space-y-6 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-100 sm:p-6" data-testid="focused-option">
            <div className="flex flex-wrap items-start justify-between gap-4">
              <div>
                <h3 id="focused" className="text-lg font-semibold">
                  {shown.cell.sku}: {arrangementLabel(shown)}, {TOPOLOGY_LABELS[shown.topology].toLowerCase()}
                </h3>
                <p className="text-sm text-ink-600">
                  {shown.cellCount} cells · {q(shown.capacitance.design, "F")} design · {q(shown.usableEnergy, "J")} usable
                  {shown.longerLife ? " · one extra cell in series for a longer life" : ""}
                </p>
              </div>
              <ChoosePanel
                key={shownId}
                slug={slug}
                viewer={viewer}
                choiceId={shownId}
                option={{ cellSku: shown.cell.sku, topology: shown.topology, seriesCount: shown.seriesCount, parallelCount: shown.parallelCount }}
                requirement={requirement}
                notes={result.notes}
                attachmentIds={attachmentIds}
                onBeforeSignIn={() => onBeforeSignIn(shownId)}
                onQuoted={onQuoted}
                summary={{
                  title: `${shown.cell.sku}: ${arrangementLabel(shown)}, ${TOPOLOGY_LABELS[shown.topology].toLowerCase()}`,
                  quantity: requirement.quantity,
                  total: shown.price ? formatMoney(shown.price.amount, currency) : null,
                  validityDays: result.quoteValidityDays,
                }}
              />
            </div>
            <OptionCautions option={shown} />
            <BankDiagram
              topology={shown.topology}
              seriesCount={shown.seriesCount}
              parallelCount={shown.parallelCount}
              cellLabel={shown.cell.sku}
              balancing={shown.balancing}
              bleeder={shown.discharge.bleeder}
            />
            <div className="grid gap-6 lg:grid-cols-2">
              <CellVoltageChart option={shown} maxVoltage={requirement.maxVoltage} />
              <DischargeChart option={shown} requirement={requirement} safeVoltage={designFactors.safeVoltage} />
            </div>
            <OptionDepthPanel option={shown} />
            <div className="max-w-3xl">
              <OptionYieldPanel key={shownId} option={shown} requirement={requirement} />
            </div>
            <OptionFigures
              option={shown}
              requirement={requirement}
              factors={designFactors}
              currency={currency}
              datasheetHref={
                (result.datasheets ?? []).includes(shown.cell.sku) ? `/api/v1/shops/${slug}/cells/${encodeURIComponent(shown.cell.sku)}/datasheet` : null
              }
            />
          </article>

          <section aria-label="Price against mass" className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-100 sm:p-6">
            <PriceMassChart
              currency={currency}
              focusedId={id}
              onSelect={onFocus}
              points={options
                .filter((o) => o.price !== null)
                .map((o) => ({
                  id: optionId(o),
                  label: `${o.cell.sku} ${arrangementLabel(o)}`,
                  massKg: o.mass,
                  price: o.price?.perBank ?? "0",
                  pareto: o.pareto,
                }))}
            />
          </section>
        </>
      )}
    </section>
  );
}
