import type { OutboxListRow } from "@/db/queries/outbox";
import { OUTBOX_STATUS_LABELS, type OutboxStatus as Status } from "@/lib/vocabulary";

const STYLES: Record<Status, string> = {
  sent: "bg-charge-100 text-charge-700",
  waiting: "bg-hazard-100 text-hazard-700",
  failed: "bg-danger-100 text-danger-700",
};

/** A message's state; a waiting message that already failed once says it will be retried, and why. */
export function OutboxStatus({ status, attempts, lastError }: Pick<OutboxListRow, "status" | "attempts" | "lastError">) {
  return (
    <div className="space-y-1">
      <span className={`inline-block rounded px-2 py-0.5 text-xs font-medium ${STYLES[status]}`}>
        {status === "waiting" && attempts > 0 ? "Waiting to retry" : OUTBOX_STATUS_LABELS[status]}
      </span>
      {lastError && status !== "sent" ? <p className="max-w-xs break-words text-xs text-ink-600">{lastError}</p> : null}
    </div>
  );
}
