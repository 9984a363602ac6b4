import { ORDER_STATUS_LABELS, type OrderStatus } from "@/lib/vocabulary";
import { ORDER_STAGES } from "@/lib/orders/stages";

export interface TimelineEntry {
  id: string;
  fromStatus: OrderStatus | null;
  toStatus: OrderStatus;
  note: string;
  at: Date;
  /** who moved it; null when the payment service or the system did */
  actorName: string | null;
}

const when = (d: Date) => `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`;

/**
 * An order's timeline: the floor's stages with the ones reached marked, then every move as it
 * happened (when, who for staff, and the note). The customer and the desk read the same one.
 */
export function OrderTimeline({ status, entries, showActors }: { status: OrderStatus; entries: TimelineEntry[]; showActors: boolean }) {
  const reached = new Set(entries.map((e) => e.toStatus));
  return (
    <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="timeline-title">
      <h2 id="timeline-title" className="text-sm font-semibold text-ink-800">
        Timeline
      </h2>
      <ol className="mt-3 flex flex-wrap gap-1.5" aria-label="Stages">
        {ORDER_STAGES.map((s) => (
          <li
            key={s}
            aria-current={s === status ? "step" : undefined}
            className={`rounded-full px-2.5 py-1 text-xs font-medium ${
              s === status ? "bg-copper-600 text-white" : reached.has(s) ? "bg-charge-100 text-charge-700" : "bg-ink-50 text-ink-600"
            }`}
          >
            {ORDER_STATUS_LABELS[s]}
          </li>
        ))}
      </ol>
      <ol className="mt-4 space-y-3 border-l-2 border-ink-100 pl-4" data-testid="order-timeline">
        {entries.map((e) => (
          <li key={e.id} className="relative">
            <span aria-hidden className="absolute -left-[1.36rem] top-1.5 h-2.5 w-2.5 rounded-full bg-copper-500" />
            <p className="text-sm">
              <strong className="font-semibold">{ORDER_STATUS_LABELS[e.toStatus]}</strong>
              <span className="num ml-2 text-xs text-ink-500">{when(e.at)}</span>
              {showActors ? <span className="ml-2 text-xs text-ink-500">{e.actorName ?? "payment service"}</span> : null}
            </p>
            {e.note ? <p className="text-sm text-ink-700">{e.note}</p> : null}
          </li>
        ))}
      </ol>
    </section>
  );
}
