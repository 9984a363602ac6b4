import Link from "next/link";
import { formatMoney } from "@/lib/pricing";
import type { RevisionDiff } from "@/lib/quoting/revision-diff";
import type { QuoteStatus } from "@/lib/vocabulary";
import { QuoteStatusBadge } from "./quote-status";
import { RevisionDiffView } from "./revision-diff-view";

export interface RevisionRow {
  revision: number;
  state: QuoteStatus;
  issuedOn: string;
  /** who issued it (shown to staff) */
  issuedBy: string | null;
  total: string;
  currency: string;
  validUntil: string;
  note: string;
  /** custom bank, engine option with overrides, or the customer's own choice */
  basis: string;
}

function RevisionSelect({ id, name, label, value, rows }: { id: string; name: string; label: string; value: number; rows: RevisionRow[] }) {
  return (
    <div>
      <label htmlFor={id} className="block text-xs font-medium text-ink-700">
        {label}
      </label>
      <select id={id} name={name} defaultValue={value} className="mt-1 rounded-md border border-ink-200 bg-white px-2 py-1.5 text-sm">
        {rows.map((r) => (
          <option key={r.revision} value={r.revision}>
            {r.revision}
          </option>
        ))}
      </select>
    </div>
  );
}

/**
 * Every revision of the quote with its state, a link to read each one, and a comparison of any
 * two (the choice lives in the URL: ?from=1&to=2).
 */
export function RevisionHistory({
  base,
  rows,
  viewing,
  compare,
  diff,
  showIssuer,
}: {
  /** the quote page's path */
  base: string;
  rows: RevisionRow[];
  viewing: number;
  compare: { from: number; to: number };
  diff: RevisionDiff | null;
  showIssuer: boolean;
}) {
  return (
    <section aria-labelledby="history-title" className="rounded-lg bg-white p-4 ring-1 ring-ink-100" data-testid="revision-history">
      <h2 id="history-title" className="text-sm font-semibold text-ink-800">
        Revisions
      </h2>
      <div className="mt-2 overflow-x-auto">
        <table className="w-full text-sm">
          <caption className="sr-only">Every revision of this quote, newest last</caption>
          <thead className="bg-ink-50 text-ink-700">
            <tr>
              <th scope="col" className="px-3 py-1.5 text-left font-medium">
                Revision
              </th>
              <th scope="col" className="hidden px-3 py-1.5 text-left font-medium sm:table-cell">
                Issued
              </th>
              <th scope="col" className="px-3 py-1.5 text-left font-medium">
                State
              </th>
              <th scope="col" className="hidden px-3 py-1.5 text-right font-medium sm:table-cell">
                Total
              </th>
              <th scope="col" className="hidden px-3 py-1.5 text-left font-medium md:table-cell">
                Valid until
              </th>
              <th scope="col" className="hidden px-3 py-1.5 text-left font-medium md:table-cell">
                Note
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr
                key={r.revision}
                className={`border-t border-ink-100 align-top ${r.revision === viewing ? "bg-copper-50" : ""}`}
                data-testid={`revision-${r.revision}`}
              >
                <th scope="row" className="whitespace-nowrap px-3 py-1.5 text-left font-medium">
                  {r.revision === viewing ? (
                    <span aria-current="page">Revision {r.revision} (shown)</span>
                  ) : (
                    <Link href={`${base}?revision=${r.revision}`} className="text-copper-700 hover:underline">
                      Revision {r.revision}
                    </Link>
                  )}
                  <span className="block text-xs font-normal text-ink-500">{r.basis}</span>
                  <span className="block text-xs font-normal text-ink-500 sm:hidden">
                    {formatMoney(r.total, r.currency)}, issued {r.issuedOn}, valid until {r.validUntil}
                  </span>
                  {r.note ? <span className="mt-1 block max-w-[14rem] whitespace-normal text-xs font-normal text-ink-700 md:hidden">{r.note}</span> : null}
                </th>
                <td className="num hidden whitespace-nowrap px-3 py-1.5 text-ink-600 sm:table-cell">
                  {r.issuedOn}
                  {showIssuer && r.issuedBy ? <span className="block text-xs">by {r.issuedBy}</span> : null}
                </td>
                <td className="px-3 py-1.5">
                  <QuoteStatusBadge status={r.state} />
                </td>
                <td className="num hidden whitespace-nowrap px-3 py-1.5 text-right sm:table-cell">{formatMoney(r.total, r.currency)}</td>
                <td className="num hidden whitespace-nowrap px-3 py-1.5 md:table-cell">{r.validUntil}</td>
                <td className="hidden max-w-xs px-3 py-1.5 text-ink-700 md:table-cell">{r.note || <span className="text-ink-400">—</span>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {rows.length > 1 ? (
        <div className="mt-4 space-y-3 border-t border-ink-100 pt-4">
          <form method="get" action={base} className="flex flex-wrap items-end gap-3" aria-label="Compare revisions">
            <input type="hidden" name="revision" value={viewing} />
            <RevisionSelect id="compare-from" name="from" label="Compare revision" value={compare.from} rows={rows} />
            <RevisionSelect id="compare-to" name="to" label="with revision" value={compare.to} rows={rows} />
            <button type="submit" className="rounded-md bg-white px-3 py-1.5 text-sm font-medium text-ink-800 ring-1 ring-ink-200 hover:bg-ink-50">
              Show what changed
            </button>
          </form>
          <h3 className="text-sm font-semibold text-ink-800">
            What changed from revision {compare.from} to revision {compare.to}
          </h3>
          {diff ? <RevisionDiffView diff={diff} /> : null}
        </div>
      ) : null}
    </section>
  );
}
