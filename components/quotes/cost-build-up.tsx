import type { CostBuildUp } from "@/lib/quoting/cost-build-up";

/** The shop's cost build-up of a frozen quote with its margin: staff only, on the desk. */
export function CostBuildUpPanel({ build }: { build: CostBuildUp }) {
  const rows: [string, string][] = [
    ["Materials", build.materials],
    ["Overhead", build.overhead],
    ["Labour", build.labour],
    ["Cost per bank", build.cost],
    [`Price per bank (margin ${build.marginPct} on price)`, build.unitPrice],
    ["Margin per bank", build.marginPerBank],
    [`Margin on the order (${build.quantity} bank${build.quantity === 1 ? "" : "s"}, after any quantity break)`, build.orderMargin],
  ];
  return (
    <section
      className="overflow-x-auto rounded-lg border-2 border-dashed border-ink-200 bg-ink-50 p-4"
      aria-labelledby="cost-title"
      // it scrolls sideways on a phone: focusable, so a keyboard can scroll it
      tabIndex={0}
      data-testid="cost-build-up"
    >
      <h2 id="cost-title" className="text-sm font-semibold text-ink-800">
        Cost build-up and margin <span className="font-normal text-ink-600">· staff only, never shown to the customer</span>
      </h2>
      <table className="mt-2 w-full min-w-[36rem] text-sm">
        <thead className="text-ink-700">
          <tr>
            <th scope="col" className="py-1.5 pr-3 text-left font-medium">
              Line (one bank)
            </th>
            <th scope="col" className="px-3 py-1.5 text-right font-medium">
              Quantity
            </th>
            <th scope="col" className="px-3 py-1.5 text-right font-medium">
              Unit cost
            </th>
            <th scope="col" className="py-1.5 pl-3 text-right font-medium">
              Amount
            </th>
          </tr>
        </thead>
        <tbody>
          {build.lines.map((l, i) => (
            <tr key={`${l.description}-${i}`} className="border-t border-ink-200">
              <td className="py-1 pr-3">{l.description}</td>
              <td className="num whitespace-nowrap px-3 py-1 text-right">
                {l.quantity} {l.unit}
              </td>
              <td className="num whitespace-nowrap px-3 py-1 text-right">{l.unitPrice}</td>
              <td className="num whitespace-nowrap py-1 pl-3 text-right">{l.amount}</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          {rows.map(([label, value]) => (
            <tr key={label} className="border-t border-ink-200">
              <th scope="row" colSpan={3} className="py-1 pr-3 text-right font-medium">
                {label}
              </th>
              <td className="num whitespace-nowrap py-1 pl-3 text-right font-medium">{value}</td>
            </tr>
          ))}
        </tfoot>
      </table>
    </section>
  );
}
