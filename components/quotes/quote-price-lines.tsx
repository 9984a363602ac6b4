import type { QuoteDocument } from "@/lib/quoting/quote-document";

/**
 * A quote's prices as its customer sees them: the bank as one line and any extra lines, then the
 * quantity discount, subtotal, tax and total. Sell prices only (lib/pricing/sell.ts).
 */
export function QuotePriceLines({ doc }: { doc: QuoteDocument }) {
  return (
    <section className="overflow-x-auto rounded-lg bg-white ring-1 ring-ink-100" aria-labelledby="price-title" data-testid="quote-price-lines">
      <h2 id="price-title" className="px-4 pt-4 text-sm font-semibold text-ink-800">
        Price
      </h2>
      <table className="mt-2 w-full text-sm">
        <thead className="bg-ink-50 text-ink-700">
          <tr>
            <th scope="col" className="px-4 py-2 text-left font-medium">
              Item
            </th>
            <th scope="col" className="px-4 py-2 text-right font-medium">
              Quantity
            </th>
            <th scope="col" className="px-4 py-2 text-right font-medium">
              Unit price
            </th>
            <th scope="col" className="px-4 py-2 text-right font-medium">
              Amount
            </th>
          </tr>
        </thead>
        <tbody>
          {doc.lines.map((l) => (
            <tr key={l.position} className="border-t border-ink-100 align-top">
              <td className="px-4 py-2">{l.description}</td>
              <td className="num whitespace-nowrap px-4 py-2 text-right">
                {l.quantity} {l.unit}
              </td>
              <td className="num whitespace-nowrap px-4 py-2 text-right">{l.unitPrice}</td>
              <td className="num whitespace-nowrap px-4 py-2 text-right">{l.amount}</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          {doc.totals.map((t, i) => (
            <tr key={t.label} className={i === doc.totals.length - 1 ? "border-t-2 border-ink-800 text-base font-semibold" : "border-t border-ink-100"}>
              <th scope="row" colSpan={3} className="px-4 py-1.5 text-right font-medium">
                {t.label}
              </th>
              <td className="num whitespace-nowrap px-4 py-1.5 text-right">{t.value}</td>
            </tr>
          ))}
        </tfoot>
      </table>
    </section>
  );
}
