import type { Change, RevisionDiff } from "@/lib/quoting/revision-diff";

function ChangeRows({ changes, from, to }: { changes: Change[]; from: number; to: number }) {
  return (
    <table className="w-full text-sm">
      <thead className="bg-ink-50 text-ink-700">
        <tr>
          <th scope="col" className="px-3 py-1.5 text-left font-medium">
            What
          </th>
          <th scope="col" className="px-3 py-1.5 text-left font-medium">
            Revision {from}
          </th>
          <th scope="col" className="px-3 py-1.5 text-left font-medium">
            Revision {to}
          </th>
        </tr>
      </thead>
      <tbody>
        {changes.map((c) => (
          <tr key={c.label} className="border-t border-ink-100 align-top">
            <th scope="row" className="px-3 py-1.5 text-left font-normal text-ink-700">
              {c.label}
            </th>
            <td className="num px-3 py-1.5 text-ink-600">
              {c.from === null ? <span className="text-ink-400">—</span> : <del className="decoration-danger-500">{c.from}</del>}
            </td>
            <td className="num px-3 py-1.5 font-medium text-ink-900">
              {c.to === null ? <span className="text-ink-400">(none)</span> : <ins className="no-underline">{c.to}</ins>}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** What changed between two revisions: the arrangement, the lines and the totals. */
export function RevisionDiffView({ diff }: { diff: RevisionDiff }) {
  if (diff.from === diff.to) return <p className="text-sm text-ink-600">Choose two different revisions to compare.</p>;
  if (diff.same)
    return (
      <p className="text-sm text-ink-600">
        Revisions {diff.from} and {diff.to} are the same in arrangement, lines and totals.
      </p>
    );
  return (
    <div className="space-y-4" data-testid="revision-diff">
      {diff.arrangement.length > 0 ? (
        <section aria-labelledby="diff-arrangement" className="overflow-x-auto">
          <h4 id="diff-arrangement" className="mb-1 text-sm font-semibold text-ink-800">
            Arrangement
          </h4>
          <ChangeRows changes={diff.arrangement} from={diff.from} to={diff.to} />
        </section>
      ) : null}
      {diff.lines.length > 0 ? (
        <section aria-labelledby="diff-lines">
          <h4 id="diff-lines" className="mb-1 text-sm font-semibold text-ink-800">
            Lines
          </h4>
          <ul className="space-y-1 text-sm">
            {diff.lines.map((l, i) => (
              <li key={i} className="rounded-md bg-ink-50 px-3 py-1.5">
                {l.kind === "added" ? (
                  <>
                    <span className="font-medium text-charge-700">Added</span> {l.line.description}: {l.line.quantity} {l.line.unit} at {l.line.unitPrice} ={" "}
                    <span className="num font-medium">{l.line.amount}</span>
                  </>
                ) : l.kind === "removed" ? (
                  <>
                    <span className="font-medium text-danger-700">Removed</span> <del>{l.line.description}</del> ({l.line.amount})
                  </>
                ) : (
                  <>
                    <span className="font-medium text-copper-700">Changed</span> {l.description}
                    <ul className="mt-0.5 space-y-0.5 pl-4 text-xs text-ink-700">
                      {l.changes.map((c) => (
                        <li key={c.label}>
                          {c.label}: <del className="decoration-danger-500">{c.from ?? "—"}</del> →{" "}
                          <ins className="no-underline font-medium text-ink-900">{c.to ?? "—"}</ins>
                        </li>
                      ))}
                    </ul>
                  </>
                )}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {diff.totals.length > 0 ? (
        <section aria-labelledby="diff-totals" className="overflow-x-auto">
          <h4 id="diff-totals" className="mb-1 text-sm font-semibold text-ink-800">
            Totals
          </h4>
          <ChangeRows changes={diff.totals} from={diff.from} to={diff.to} />
        </section>
      ) : null}
    </div>
  );
}
