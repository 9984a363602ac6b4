import { FigureRows as Rows } from "@/components/bank-depth/figure-rows";
import type { OptionFailureVerdict } from "@/lib/bank";
import { failureVerdict, handlingRows, lifeHeadline, lifeRows } from "@/lib/quoting/option-depth-words";
import type { PricedOption } from "@/lib/quoting/types";

const VERDICT_STYLE = {
  yes: "bg-charge-100 text-charge-700",
  "above rating": "bg-hazard-100 text-hazard-700",
  no: "bg-danger-100 text-danger-700",
} as const;

function Verdict({ v }: { v: OptionFailureVerdict }) {
  const verdict = failureVerdict(v);
  // the text already begins "Survives one shorted cell: no — …": the badge repeats the answer at a glance
  const [lead, ...rest] = v.text.split(": ");
  return (
    <li className="flex flex-col gap-1 sm:flex-row sm:items-baseline sm:gap-3">
      <span className={`inline-flex w-fit shrink-0 rounded px-2 py-0.5 text-xs font-semibold uppercase tracking-wide ${VERDICT_STYLE[verdict]}`}>
        {verdict}
      </span>
      <span>
        <span className="font-medium text-ink-900">{lead}:</span> {rest.join(": ")}
      </span>
    </li>
  );
}

/** The focused option's one-cell failures, temperature and life, and limits and handling. */
export function OptionDepthPanel({ option }: { option: PricedOption }) {
  const handling = handlingRows(option);
  return (
    <div className="grid gap-6 text-sm lg:grid-cols-2" data-testid="option-depth">
      <section aria-labelledby="failures-title" className="lg:col-span-2">
        <h4 id="failures-title" className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-500">
          One failed cell
        </h4>
        <ul className="space-y-2" data-testid="failure-summary">
          <Verdict v={option.failures.short} />
          <Verdict v={option.failures.open} />
        </ul>
        <p className="mt-1 text-xs text-ink-600">At the working voltage by ideal capacitive division, without balancing, matched cells at their worst.</p>
      </section>
      <section aria-labelledby="life-title" data-testid="life-summary">
        <h4 id="life-title" className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-500">
          Temperature and life
        </h4>
        {option.life ? (
          <>
            <Rows rows={lifeRows(option.life)} />
            <details className="mt-2 text-xs text-ink-600">
              <summary className="cursor-pointer text-ink-700">How the life is estimated</summary>
              <ul className="mt-1 list-disc space-y-1 pl-5">
                {option.life.assumptions.map((a) => (
                  <li key={a}>{a}</li>
                ))}
              </ul>
            </details>
          </>
        ) : (
          <p className="text-ink-600">Expected life: {lifeHeadline(null)}.</p>
        )}
      </section>
      <section aria-labelledby="handling-title">
        <h4 id="handling-title" className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-500">
          Limits, handling and shipping
        </h4>
        <Rows rows={handling.rows} />
        <ul className="mt-2 list-disc space-y-1 pl-5 text-xs text-ink-600">
          {handling.shipping.map((s) => (
            <li key={s}>{s}</li>
          ))}
        </ul>
      </section>
    </div>
  );
}
