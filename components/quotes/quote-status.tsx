import { QUOTE_STATUS_LABELS, type QuoteStatus } from "@/lib/vocabulary";

const TONE: Record<QuoteStatus, string> = {
  draft: "bg-ink-100 text-ink-700",
  sent: "bg-charge-100 text-charge-700 ring-1 ring-charge-300",
  accepted: "bg-charge-500 text-white",
  declined: "bg-danger-100 text-danger-700",
  expired: "bg-hazard-100 text-hazard-700",
  superseded: "bg-ink-100 text-ink-600",
  withdrawn: "bg-ink-100 text-ink-700 line-through decoration-ink-400",
};

/** A revision's or a quote's state as a small label. */
export function QuoteStatusBadge({ status, className = "" }: { status: QuoteStatus; className?: string }) {
  return (
    <span className={`inline-flex whitespace-nowrap rounded-full px-2 py-0.5 text-xs font-medium ${TONE[status]} ${className}`} data-status={status}>
      {QUOTE_STATUS_LABELS[status]}
    </span>
  );
}
