import { BankDiagram } from "@/components/bank-diagram/bank-diagram";
import { NetworkDiagram } from "@/components/bank-diagram/network-diagram";
import { QuoteEngineeringSection } from "./quote-engineering-section";
import type { LabelledValue, QuoteDocument } from "@/lib/quoting/quote-document";
import { QuotePriceLines } from "./quote-price-lines";

function Facts({ title, rows }: { title: string; rows: LabelledValue[] }) {
  return (
    <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
      <h2 className="text-sm font-semibold text-ink-800">{title}</h2>
      <dl className="mt-2 divide-y divide-ink-100 text-sm">
        {rows.map((r) => (
          <div key={r.label} className="grid grid-cols-2 gap-3 py-1.5">
            <dt className="text-ink-600">{r.label}</dt>
            <dd className="num text-ink-900">{r.value}</dd>
          </div>
        ))}
      </dl>
    </section>
  );
}

/** A frozen quote revision as the customer and the shop's staff see it; the PDF says the same. */
export function QuoteView({
  doc,
  pdfHref,
  staffOnly,
  datasheetHref,
}: {
  doc: QuoteDocument;
  pdfHref: string;
  staffOnly?: React.ReactNode;
  datasheetHref?: string | null;
}) {
  const o = doc.option;
  return (
    <article className="space-y-6" aria-labelledby="quote-title">
      <header className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <p className="text-sm text-ink-600">{doc.shopName}</p>
          <h1 id="quote-title" className="text-2xl font-semibold">
            Quote <span data-testid="quote-number">{doc.number}</span>
            <span className="ml-2 text-base font-normal text-ink-600">revision {doc.revision}</span>
          </h1>
          <p className="mt-1 text-sm text-ink-600">
            Issued {doc.issuedOn} for {doc.customerName} · valid until <strong className="text-ink-800">{doc.validUntil}</strong>
          </p>
        </div>
        <div className="text-right">
          <p className="text-sm text-ink-600">Total ({doc.currency})</p>
          <p className="num text-3xl font-semibold text-ink-900" data-testid="quote-total">
            {doc.total}
          </p>
          <a href={pdfHref} className="mt-2 inline-flex rounded-md bg-copper-600 px-4 py-2 text-sm font-medium text-white hover:bg-copper-700" download>
            Download PDF
          </a>
        </div>
      </header>

      <section className="rounded-lg border-l-4 border-hazard-500 bg-hazard-100 p-4" aria-labelledby="cautions-title">
        <h2 id="cautions-title" className="text-sm font-semibold text-hazard-700">
          Safety
        </h2>
        <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-ink-800">
          {doc.cautions.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </section>

      <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
        <h2 className="text-sm font-semibold text-ink-800">The bank</h2>
        {doc.design.source === "custom" ? (
          <NetworkDiagram tree={doc.design.network} weakest={doc.design.figures.weakest.id} />
        ) : (
          <BankDiagram
            topology={o.topology}
            seriesCount={o.seriesCount}
            parallelCount={o.parallelCount}
            cellLabel={o.cell.sku}
            balancing={o.balancing}
            bleeder={o.discharge.bleeder ? { resistance: o.discharge.bleeder.resistance, switched: o.discharge.bleeder.switched } : null}
          />
        )}
      </section>

      <div className="grid gap-4 md:grid-cols-2">
        <Facts title="Your requirement" rows={doc.requirement} />
        <Facts title="Arrangement" rows={doc.arrangement} />
        <Facts title="Bank figures" rows={doc.figures} />
        <div className="space-y-2">
          <Facts title="Cell" rows={doc.cell} />
          {datasheetHref ? (
            <a href={datasheetHref} className="inline-flex text-sm font-medium text-copper-600 hover:underline" data-testid="datasheet-link">
              Cell datasheet (PDF)
            </a>
          ) : null}
        </div>
      </div>

      <QuoteEngineeringSection e={doc.engineering} />

      <QuotePriceLines doc={doc} />

      {staffOnly}

      {doc.notes.length > 0 ? (
        <section className="rounded-lg bg-white p-4 text-sm ring-1 ring-ink-100">
          <h2 className="font-semibold text-ink-800">Notes</h2>
          <ul className="mt-1 list-disc space-y-1 pl-5 text-ink-700">
            {doc.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </section>
      ) : null}
    </article>
  );
}
