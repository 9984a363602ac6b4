import { QUOTE_MESSAGE_KIND_LABELS, type QuoteMessageKind } from "@/lib/vocabulary";

export interface ThreadMessage {
  id: string;
  side: "customer" | "shop";
  kind: QuoteMessageKind;
  body: string;
  authorName: string | null;
  revision: number;
  at: Date;
}

const when = (d: Date) => `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`;

/**
 * The conversation about a quote between its customer and the shop, oldest first; the reader's own
 * side is on the right. `form` is the writing box for this reader's side.
 */
export function QuoteThread({
  messages,
  reader,
  shopName,
  form,
}: {
  messages: ThreadMessage[];
  reader: "customer" | "shop";
  shopName: string;
  form: React.ReactNode;
}) {
  return (
    <section aria-labelledby="thread-title" className="rounded-lg bg-white p-4 ring-1 ring-ink-100" data-testid="quote-thread">
      <h2 id="thread-title" className="text-sm font-semibold text-ink-800">
        Messages
      </h2>
      {messages.length === 0 ? (
        <p className="mt-2 text-sm text-ink-600">
          {reader === "customer" ? `No messages yet. Questions about this quote, or a change you need, go to ${shopName} from here.` : "No messages yet."}
        </p>
      ) : (
        <ol className="mt-3 space-y-3">
          {messages.map((m) => {
            const own = m.side === reader;
            return (
              <li key={m.id} className={`flex ${own ? "justify-end" : "justify-start"}`} data-testid="thread-message" data-kind={m.kind}>
                <article
                  className={`max-w-[36rem] rounded-lg px-3 py-2 text-sm ${own ? "bg-copper-50 ring-1 ring-copper-100" : "bg-ink-50 ring-1 ring-ink-100"}`}
                >
                  <header className="flex flex-wrap items-baseline gap-x-2 text-xs text-ink-600">
                    <span className="font-semibold text-ink-800">{m.authorName ?? (m.side === "shop" ? shopName : "Customer")}</span>
                    <span>{m.side === "shop" ? shopName : "customer"}</span>
                    <time dateTime={m.at.toISOString()}>{when(m.at)}</time>
                    <span>· revision {m.revision}</span>
                    {m.kind !== "message" ? (
                      <span className="rounded bg-white px-1.5 py-0.5 font-medium text-copper-700 ring-1 ring-copper-100">
                        {QUOTE_MESSAGE_KIND_LABELS[m.kind]}
                      </span>
                    ) : null}
                  </header>
                  <p className="mt-1 whitespace-pre-wrap break-words text-ink-900">{m.body}</p>
                </article>
              </li>
            );
          })}
        </ol>
      )}
      <div className="mt-4 border-t border-ink-100 pt-4">{form}</div>
    </section>
  );
}
