import { FigureRows } from "@/components/bank-depth/figure-rows";
import { YieldHistogram } from "@/components/bank-depth/yield-histogram";
import type { QuoteEngineering } from "@/lib/quoting/quote-engineering";
import type { LabelledValue } from "@/lib/vocabulary";

function Rows({ rows }: { rows: LabelledValue[] }) {
  return <FigureRows rows={rows} layout="columns" />;
}

/**
 * The quote's engineering sections (the same words as the PDF, lib/quoting/quote-engineering.ts):
 * what one failed cell does, the tolerance yield as a histogram, temperature and expected life,
 * and the bank's limits, handling and shipping.
 */
export function QuoteEngineeringSection({ e }: { e: QuoteEngineering }) {
  return (
    <section aria-labelledby="engineering-title" className="space-y-4" data-testid="quote-engineering">
      <h2 id="engineering-title" className="text-lg font-semibold text-ink-900">
        How the bank fails and how long it lasts
      </h2>
      <div className="grid gap-4 md:grid-cols-2">
        <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="q-failures" data-testid="quote-failures">
          <h3 id="q-failures" className="text-sm font-semibold text-ink-800">
            One failed cell
          </h3>
          {e.failures ? (
            <ul className="mt-2 space-y-2 text-sm text-ink-800">
              <li>{e.failures.short}</li>
              <li>{e.failures.open}</li>
            </ul>
          ) : (
            <p className="mt-2 text-sm text-ink-600">One-cell failures: {e.absent}.</p>
          )}
          <p className="mt-2 text-xs text-ink-600">At the working voltage by ideal capacitive division, without balancing, matched cells at their worst.</p>
        </section>
        <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="q-life" data-testid="quote-life">
          <h3 id="q-life" className="text-sm font-semibold text-ink-800">
            Temperature and expected life
          </h3>
          {e.life ? (
            <>
              <Rows rows={e.life.rows} />
              <ul className="mt-2 list-disc space-y-1 pl-5 text-xs text-ink-600">
                {e.life.assumptions.map((a) => (
                  <li key={a}>{a}</li>
                ))}
              </ul>
            </>
          ) : (
            <p className="mt-2 text-sm text-ink-600">Expected life: {e.lifeNote}.</p>
          )}
        </section>
        <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="q-yield" data-testid="quote-yield">
          <h3 id="q-yield" className="text-sm font-semibold text-ink-800">
            Tolerance yield
          </h3>
          {e.tolerance ? (
            <>
              <p className="mt-2 text-sm font-medium text-ink-900">{e.tolerance.headline}</p>
              <YieldHistogram
                bins={e.tolerance.histogram}
                required={e.tolerance.required}
                label={`Capacitance of ${e.tolerance.samples} sampled banks. ${e.tolerance.headline}`}
              />
              <Rows rows={e.tolerance.rows} />
            </>
          ) : (
            <p className="mt-2 text-sm text-ink-600">Tolerance yield: {e.absent}.</p>
          )}
        </section>
        <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="q-handling">
          <h3 id="q-handling" className="text-sm font-semibold text-ink-800">
            Limits, handling and shipping
          </h3>
          <Rows rows={e.handling.rows} />
          <ul className="mt-2 list-disc space-y-1 pl-5 text-xs text-ink-600">
            {e.handling.shipping.map((s) => (
              <li key={s}>{s}</li>
            ))}
          </ul>
        </section>
      </div>
    </section>
  );
}
