import type { WebhookDeliveryView } from "@/db/queries/webhooks";
import { WEBHOOK_DELIVERY_STATE_LABELS, type WebhookDeliveryState } from "@/lib/vocabulary";

const STYLES: Record<WebhookDeliveryState, string> = {
  delivered: "bg-charge-100 text-charge-700",
  waiting: "bg-ink-100 text-ink-700",
  retrying: "bg-hazard-100 text-hazard-700",
  failed: "bg-danger-100 text-danger-700",
  cancelled: "bg-ink-100 text-ink-600",
};

/** A delivery's state with the last attempt's reason when it did not get through. */
export function DeliveryState({ d }: { d: Pick<WebhookDeliveryView, "state" | "lastError"> }) {
  return (
    <div className="space-y-1">
      <span className={`inline-block rounded px-2 py-0.5 text-xs font-medium ${STYLES[d.state]}`}>{WEBHOOK_DELIVERY_STATE_LABELS[d.state]}</span>
      {d.lastError && d.state !== "delivered" ? <p className="max-w-xs break-words text-xs text-ink-600">{d.lastError}</p> : null}
    </div>
  );
}
