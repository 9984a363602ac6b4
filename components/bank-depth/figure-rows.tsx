import type { LabelledValue } from "@/lib/vocabulary";

/**
 * Labelled figures as a definition list: "split" puts each value at the right of its label (the
 * storefront's panels), "columns" in a second column (the quote page).
 */
export function FigureRows({ rows, layout = "split" }: { rows: LabelledValue[]; layout?: "split" | "columns" }) {
  return (
    <dl className={`divide-y divide-ink-100 ${layout === "columns" ? "mt-2 text-sm" : ""}`}>
      {rows.map((r) => (
        <div key={r.label} className={layout === "columns" ? "grid grid-cols-2 gap-3 py-1.5" : "flex justify-between gap-4 py-1"}>
          <dt className="text-ink-600">{r.label}</dt>
          <dd className={`num text-ink-900 ${layout === "columns" ? "" : "text-right font-medium"}`}>{r.value}</dd>
        </div>
      ))}
    </dl>
  );
}
