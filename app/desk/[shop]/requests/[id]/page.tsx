import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { QuoteStatusBadge } from "@/components/quotes/quote-status";
import { PageHeader } from "@/components/ui/page-header";
import { listRequestAttachments } from "@/db/queries/attachments";
import { loadShopCatalog } from "@/db/queries/catalog";
import { getQuoteDraft, getQuoteLife, getRequestForReview, listCustomerQuotes, listRetiredCells } from "@/db/queries/quote-life";
import { requireShopPage } from "@/lib/auth/guards";
import { formatMoney } from "@/lib/pricing";
import { NO_OVERRIDES } from "@/lib/quoting/review-search";
import type { ChosenRecord } from "@/lib/quoting/types";
import { workbenchDraftSchema, type WorkbenchDraft } from "@/lib/validation/workbench";
import { describeRequirement, EXTRA_LINE_KINDS, REQUEST_STATUS_LABELS, requirementFacts, type ExtraLineKind } from "@/lib/vocabulary";
import { Workbench } from "./_components/workbench";

export const metadata: Metadata = { title: "Review workbench" };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const IMAGE = new Set(["image/png", "image/jpeg"]);

function choiceOf(c: ChosenRecord | null) {
  if (!c) return null;
  return "cellSku" in c
    ? { sku: c.cellSku, topology: c.topology, seriesCount: c.seriesCount, parallelCount: c.parallelCount }
    : { sku: c.cell.sku, topology: c.topology, seriesCount: c.seriesCount, parallelCount: c.parallelCount };
}

/**
 * The review workbench for one request: what the customer asked for (the whole requirement, their
 * notes and drawings), who they are and their earlier quotes, what they said about this quote, and
 * the editor that makes the next revision — from the saved draft, the latest revision, or the
 * customer's own choice.
 */
export default async function WorkbenchPage({ params }: { params: Promise<{ shop: string; id: string }> }) {
  const { shop, id } = await params;
  const ctx = await requireShopPage(shop, "request:review", `/desk/${shop}/requests/${id}`);
  const found = UUID.test(id) ? await getRequestForReview(ctx.shop.id, id) : null;
  if (!found) notFound();
  const request = found.request;
  const [attachments, earlier, catalog, retired, saved, life] = await Promise.all([
    listRequestAttachments(ctx.shop.id, request.id),
    listCustomerQuotes(ctx.shop.id, request.customerUserId),
    loadShopCatalog(ctx.shop.id),
    listRetiredCells(ctx.shop.id),
    getQuoteDraft(ctx.shop.id, request.id),
    found.quoteId ? getQuoteLife(ctx.shop.id, found.quoteId) : Promise.resolve(null),
  ]);
  const latest = life?.revisions.at(-1)?.revision ?? null;
  const fresh: WorkbenchDraft = {
    bank:
      latest?.design?.source === "custom"
        ? { kind: "custom", network: latest.design.network, overrides: NO_OVERRIDES }
        : {
            kind: "engine",
            choice: latest ? choiceOf(latest.arrangement) : choiceOf(request.chosenOption),
            overrides: latest?.design?.source === "engine" ? latest.design.overrides : NO_OVERRIDES,
          },
    bankPrice: latest?.sheet?.lines[0]?.listUnitPrice
      ? { unitPrice: latest.sheet.lines[0].unitPrice, reason: latest.sheet.lines[0].overrideReason ?? "" }
      : null,
    lines:
      latest?.sheet?.lines
        .filter((l) => l.code !== "bank")
        .map((l) => ({
          kind: (EXTRA_LINE_KINDS as readonly string[]).includes(l.code) ? (l.code as ExtraLineKind) : "other",
          description: l.description,
          quantity: l.quantity,
          unit: l.unit,
          unitPrice: l.unitPrice,
        })) ?? [],
    discount: latest?.sheet?.discount ? { kind: latest.sheet.discount.kind, value: latest.sheet.discount.value, reason: latest.sheet.discount.reason } : null,
    validityDays: catalog.rules.quoteValidityDays,
    note: "",
  };
  const stored = saved ? workbenchDraftSchema.safeParse(saved.body) : null;
  const initialDraft = stored?.success ? stored.data : fresh;
  const customerWords = life?.messages.filter((m) => m.side === "customer").slice(-3) ?? [];
  const facts = requirementFacts(request.requirement);

  return (
    <div className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-600">
        <Link href={`/desk/${shop}/requests`} className="hover:underline">
          Requests
        </Link>{" "}
        / {found.customerName}
      </nav>
      <PageHeader title={`Request from ${found.customerName}`}>
        {describeRequirement(request.requirement)} · received {request.createdAt.toISOString().slice(0, 10)} · {REQUEST_STATUS_LABELS[request.status]}
      </PageHeader>

      <div className="grid gap-4 lg:grid-cols-3">
        <section aria-labelledby="req-title" className="rounded-lg bg-white p-4 ring-1 ring-ink-100 lg:col-span-2" data-testid="review-request">
          <h2 id="req-title" className="text-sm font-semibold text-ink-800">
            What the customer asked for
          </h2>
          <dl className="mt-2 grid grid-cols-1 gap-x-4 text-sm sm:grid-cols-2">
            {facts.map((f) => (
              <div key={f.label} className="flex justify-between gap-3 border-b border-ink-100 py-1">
                <dt className="text-ink-600">{f.label}</dt>
                <dd className="num text-right text-ink-900">{f.value}</dd>
              </div>
            ))}
          </dl>
          {request.reviewReasons.length > 0 ? (
            <div className="mt-3">
              <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-600">Why it came to review</h3>
              <ul className="mt-1 list-disc space-y-0.5 pl-5 text-sm text-ink-700">
                {request.reviewReasons.map((r) => (
                  <li key={r}>{r}</li>
                ))}
              </ul>
            </div>
          ) : null}
          <div className="mt-3">
            <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-600">The customer&apos;s notes</h3>
            {request.notes ? (
              <p className="mt-1 whitespace-pre-wrap break-words rounded-md bg-ink-50 p-3 text-sm text-ink-900" data-testid="request-notes">
                {request.notes}
              </p>
            ) : (
              <p className="mt-1 text-sm text-ink-500">No notes.</p>
            )}
          </div>
          <div className="mt-3">
            <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-600">Drawings and specifications</h3>
            {attachments.length === 0 ? <p className="mt-1 text-sm text-ink-500">None attached.</p> : null}
            <ul className="mt-2 grid gap-3 sm:grid-cols-2" data-testid="request-attachments">
              {attachments.map((a) => {
                const href = `/api/v1/shops/${shop}/attachments/${a.id}`;
                const kb = `${Math.max(1, Math.round(a.sizeBytes / 1024)).toLocaleString("en-GB")} KB`;
                return (
                  <li key={a.id} className="rounded-md bg-ink-50 p-2 text-sm ring-1 ring-ink-100">
                    {IMAGE.has(a.contentType) ? (
                      <a href={`${href}?view=inline`} target="_blank" rel="noopener">
                        <img src={`${href}?view=inline`} alt={`Attached drawing ${a.fileName}`} className="max-h-56 w-full rounded bg-white object-contain" />
                      </a>
                    ) : null}
                    <p className="mt-1 break-all font-medium text-ink-800">{a.fileName}</p>
                    <p className="text-xs text-ink-600">
                      {a.contentType === "image/vnd.dxf" ? "DXF drawing" : a.contentType === "application/pdf" ? "PDF" : "Image"}, {kb} ·{" "}
                      {a.contentType === "image/vnd.dxf" ? (
                        <a href={href} download className="text-copper-700 hover:underline">
                          Download
                        </a>
                      ) : (
                        <>
                          <a href={`${href}?view=inline`} target="_blank" rel="noopener" className="text-copper-700 hover:underline">
                            View
                          </a>{" "}
                          ·{" "}
                          <a href={href} download className="text-copper-700 hover:underline">
                            Download
                          </a>
                        </>
                      )}
                    </p>
                  </li>
                );
              })}
            </ul>
          </div>
        </section>

        <section aria-labelledby="cust-title" className="space-y-3 rounded-lg bg-white p-4 ring-1 ring-ink-100">
          <h2 id="cust-title" className="text-sm font-semibold text-ink-800">
            The customer
          </h2>
          <p className="text-sm">
            {found.customerName}
            <span className="block text-ink-600">{found.customerEmail}</span>
          </p>
          {found.quoteNumber ? (
            <p className="flex flex-wrap items-center gap-2 text-sm">
              This request&apos;s quote:{" "}
              <Link href={`/desk/${shop}/quotes/${found.quoteNumber}`} className="font-medium text-copper-700 hover:underline">
                {found.quoteNumber} r{found.currentRevision}
              </Link>
              {found.quoteStatus ? <QuoteStatusBadge status={found.quoteStatus} /> : null}
              {found.changeRequestedAt ? (
                <span className="rounded-full bg-hazard-100 px-2 py-0.5 text-xs font-medium text-hazard-700">Change asked for</span>
              ) : null}
            </p>
          ) : null}
          <div>
            <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-600">Their quotes</h3>
            {earlier.length === 0 ? <p className="mt-1 text-sm text-ink-500">None yet.</p> : null}
            <ul className="mt-1 space-y-1 text-sm">
              {earlier.map((q) => (
                <li key={q.number} className="flex flex-wrap items-center justify-between gap-2">
                  <Link href={`/desk/${shop}/quotes/${q.number}`} className="text-copper-700 hover:underline">
                    {q.number} r{q.revision}
                  </Link>
                  <span className="num text-ink-700">{formatMoney(q.total, q.currency)}</span>
                  <QuoteStatusBadge status={q.status} />
                </li>
              ))}
            </ul>
          </div>
          {customerWords.length > 0 ? (
            <div>
              <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-600">What they said about this quote</h3>
              <ul className="mt-1 space-y-2 text-sm">
                {customerWords.map((m) => (
                  <li key={m.id} className="rounded-md bg-hazard-100/60 p-2">
                    <span className="block text-xs text-ink-600">
                      {m.at.toISOString().slice(0, 10)}, on revision {m.revision}
                    </span>
                    <span className="whitespace-pre-wrap">{m.body}</span>
                  </li>
                ))}
              </ul>
            </div>
          ) : null}
        </section>
      </div>

      {found.quoteStatus === "accepted" ? (
        <p className="rounded-md bg-charge-100 px-4 py-3 text-sm text-charge-700">
          The customer accepted {found.quoteNumber}: it cannot be revised. A change now takes a new quote.
        </p>
      ) : (
        <>
          {saved ? (
            <p className="text-sm text-ink-600">
              Draft saved {saved.updatedAt.toISOString().slice(0, 16).replace("T", " ")} UTC{saved.updatedByName ? ` by ${saved.updatedByName}` : ""}.
            </p>
          ) : null}
          <Workbench
            shop={shop}
            requestId={request.id}
            requirement={request.requirement}
            rules={catalog.rules}
            shopFactors={catalog.factors}
            cells={[...catalog.cells, ...retired]}
            retiredSkus={retired.map((c) => c.sku)}
            components={catalog.components}
            initialDraft={initialDraft}
            draftVersion={saved?.version ?? 0}
            basedOnRevision={found.currentRevision ?? 0}
            quoteNumber={found.quoteNumber}
          />
        </>
      )}
    </div>
  );
}
