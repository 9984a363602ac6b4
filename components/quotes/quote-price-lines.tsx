import type { QuoteDocument } from "@/lib/quoting/quote-document";

/**
 * A quote's prices as its customer sees them: the bank as one line and any extra lines, then the
 * quantity discount, subtotal, tax and total. Sell prices only (lib/pricing/sell.ts). On a phone the
 * unit price moves under the item, so the amounts and the total stay on screen.
 */
export function QuotePriceLines({ doc }: { doc: QuoteDocument }) {
  return (
    <section className="scroll-cue rounded-lg bg-white ring-1 ring-ink-100" aria-labelledby="price-title" data-testid="quote-price-lines">
      <h2 id="price-title" className="px-4 pt-4 text-sm font-semibold text-ink-800">
        Price
      </h2>
      <table className="mt-2 w-full text-sm">
        <thead className="bg-ink-50 text-ink-700">
          <tr>
            <th scope="col" className="px-3 py-2 text-left font-medium sm:px-4">
              Item
            </th>
            <th scope="col" className="px-3 py-2 text-right font-medium sm:px-4">
              Quantity
            </th>
            <th scope="col" className="hidden px-4 py-2 text-right font-medium sm:table-cell">
              Unit price
            </th>
            <th scope="col" className="px-3 py-2 text-right font-medium sm:px-4">
              Amount
            </th>
          </tr>
        </thead>
        <tbody>
          {doc.lines.map((l) => (
            <tr key={l.position} className="border-t border-ink-100 align-top">
              <td className="px-3 py-2 sm:px-4">
                {l.description}
                <span className="num mt-0.5 block text-xs text-ink-600 sm:hidden">{l.unitPrice} each</span>
              </td>
              <td className="num whitespace-nowrap px-3 py-2 text-right sm:px-4">
                {l.quantity} {l.unit}
              </td>
              <td className="num hidden whitespace-nowrap px-4 py-2 text-right sm:table-cell">{l.unitPrice}</td>
              <td className="num whitespace-nowrap px-3 py-2 text-right sm:px-4">{l.amount}</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          {doc.totals.map((t, i) => (
            <tr key={t.label} className={i === doc.totals.length - 1 ? "border-t-2 border-ink-800 text-base font-semibold" : "border-t border-ink-100"}>
              <td className="hidden sm:table-cell" />
              <th scope="row" colSpan={2} className="px-3 py-1.5 text-right font-medium sm:px-4">
                {t.label}
              </th>
              <td className="num whitespace-nowrap px-3 py-1.5 text-right sm:px-4">{t.value}</td>
            </tr>
          ))}
        </tfoot>
      </table>
    </section>
  );
}
