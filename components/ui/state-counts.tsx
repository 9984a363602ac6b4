/** How many records of a list are in each state, as a row of small figures above the list. */
export function StateCounts<S extends string>({
  label,
  states,
  labels,
  counts,
  testId,
}: {
  label: string;
  states: readonly S[];
  labels: Record<S, string>;
  counts: Record<S, number>;
  /** each figure's test id is `${testId}-${state}` */
  testId: string;
}) {
  return (
    <dl className="flex flex-wrap gap-3 text-sm" aria-label={label}>
      {states.map((s) => (
        <div key={s} className="rounded-lg bg-white px-4 py-2 ring-1 ring-ink-100">
          <dt className="text-xs text-ink-600">{labels[s]}</dt>
          <dd className="num text-lg font-semibold" data-testid={`${testId}-${s}`}>
            {counts[s]}
          </dd>
        </div>
      ))}
    </dl>
  );
}
