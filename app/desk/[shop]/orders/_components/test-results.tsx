import type { LatestTest } from "@/db/queries/orders";
import { testSteps } from "@/lib/orders/order-document";
import type { TestLimits } from "@/lib/orders/types";
import type { Technology } from "@/lib/bank/types";

/** The limits each bank is tested against, from the quote's frozen specification. */
export function TestLimitsTable({ limits, technology }: { limits: TestLimits; technology: Technology }) {
  return (
    <table
      className="w-full text-sm"
      data-testid="test-limits"
      data-capacitance={limits.capacitance.nominal}
      data-esr={limits.esr.new}
      data-position-voltage={limits.positionVoltage.nominal}
      data-positions={limits.positions.length}
      data-hold={limits.minHoldMinutes}
    >
      <caption className="pb-1 text-left text-xs text-ink-600">Limits from the quote's frozen specification</caption>
      <tbody>
        {testSteps(limits, technology).map((s) => (
          <tr key={s.step} className="border-t border-ink-100">
            <th scope="row" className="py-1 pr-3 text-left font-normal text-ink-700">
              {s.step}
            </th>
            <td className="num py-1 text-right">{s.limit}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** Each bank's latest test with every check's verdict; a bank with none says so. */
export function TestResults({ quantity, tests }: { quantity: number; tests: LatestTest[] }) {
  const shown = tests.slice(0, 50);
  const untested = quantity - tests.length;
  return (
    <div className="space-y-3" data-testid="test-results">
      {shown.map((t) => (
        <div key={t.id} className="rounded-md ring-1 ring-ink-100">
          <p
            className={`flex flex-wrap justify-between gap-2 rounded-t-md px-3 py-1.5 text-sm font-medium ${t.isPassed ? "bg-charge-100 text-charge-700" : "bg-danger-100 text-danger-700"}`}
          >
            <span>
              Bank {t.bank}: {t.isPassed ? "passed" : "failed"}
            </span>
            <span className="text-xs font-normal">
              {t.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC · {t.testedBy ?? "—"}
            </span>
          </p>
          <div className="scroll-cue" role="region" aria-label="Test readings" tabIndex={0}>
            <table className="w-full text-sm">
              <thead className="text-xs text-ink-600">
                <tr>
                  <th scope="col" className="px-3 py-1 text-left font-medium">
                    Check
                  </th>
                  <th scope="col" className="px-3 py-1 text-left font-medium">
                    Measured
                  </th>
                  <th scope="col" className="px-3 py-1 text-left font-medium">
                    Limit
                  </th>
                </tr>
              </thead>
              <tbody>
                {t.checks.map((c) => (
                  <tr key={c.key} className="border-t border-ink-100">
                    <td className="px-3 py-1">
                      <span aria-hidden className={c.passed ? "text-charge-700" : "text-danger-700"}>
                        {c.passed ? "✓" : "✗"}
                      </span>{" "}
                      {c.label}
                      <span className="sr-only">{c.passed ? " passed" : " failed"}</span>
                    </td>
                    <td className="num px-3 py-1">{c.measured}</td>
                    <td className="num px-3 py-1 text-ink-600">{c.limit}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </div>
      ))}
      {tests.length > shown.length ? <p className="text-xs text-ink-600">And {tests.length - shown.length} more banks tested.</p> : null}
      {untested > 0 ? (
        <p className="text-sm text-ink-600">
          {untested} of {quantity} bank{quantity === 1 ? "" : "s"} not tested yet.
        </p>
      ) : null}
    </div>
  );
}
