/**
 * The options table's words in plain language, folded under the table: what a customer meets in
 * its headings and arrangements ("C design", "20 S × 2 P", "parallel groups in series", Pareto).
 */
const TERMS: { term: string; words: string }[] = [
  {
    term: "20 S × 2 P",
    words: "20 cells (or groups of cells) connected one after another (in series) to reach the voltage, and 2 side by side (in parallel) for more capacitance.",
  },
  {
    term: "Parallel groups in series",
    words: "Cells are first joined side by side into groups; the groups are then joined one after another. One balancing resistor serves each group.",
  },
  {
    term: "Series strings in parallel",
    words:
      "Cells are first joined one after another into strings; the strings are then joined side by side. Each cell of each string has its own balancing resistor.",
  },
  {
    term: "C design",
    words:
      "The capacitance the bank is sized on: the nominal value less the cells' tolerance and ageing, so the bank still does the job at the end of its life.",
  },
  { term: "ESR end of life", words: "The bank's internal resistance once the cells have aged: it sets how far the voltage drops under a heavy current." },
  {
    term: "Pareto ◆",
    words:
      "A best trade-off: no other option is cheaper, lighter and smaller all at once. Options without the mark are beaten on all three by at least one other.",
  },
  {
    term: "One cell fails",
    words: "Whether the bank keeps working if one cell shorts or goes open, and whether the other cells then stay within their rating.",
  },
];

export function OptionGlossary() {
  return (
    <details className="rounded-lg bg-white px-4 py-2 text-sm ring-1 ring-ink-100" data-testid="option-glossary">
      <summary className="cursor-pointer font-medium text-ink-800">What the columns and arrangements mean</summary>
      <dl className="mt-2 grid gap-x-6 gap-y-2 pb-2 sm:grid-cols-2">
        {TERMS.map((t) => (
          <div key={t.term}>
            <dt className="font-medium text-ink-900">{t.term}</dt>
            <dd className="text-ink-700">{t.words}</dd>
          </div>
        ))}
      </dl>
    </details>
  );
}
