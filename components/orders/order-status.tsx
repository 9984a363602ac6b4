import { ORDER_STATUS_LABELS, type OrderStatus } from "@/lib/vocabulary";

const TONES: Record<OrderStatus, string> = {
  paid: "bg-ink-100 text-ink-800",
  kitting: "bg-copper-100 text-copper-700",
  assembling: "bg-copper-100 text-copper-700",
  testing: "bg-copper-100 text-copper-700",
  ready: "bg-charge-100 text-charge-700",
  shipped: "bg-charge-100 text-charge-700",
  delivered: "bg-charge-100 text-charge-700",
  "on-hold": "bg-hazard-100 text-hazard-700",
  cancelled: "bg-ink-100 text-ink-600",
  refunded: "bg-ink-100 text-ink-600",
};

/** An order's status as a label, with the stage it stopped at when it is on hold. */
export function OrderStatusBadge({ status, heldFrom }: { status: OrderStatus; heldFrom?: OrderStatus | null }) {
  return (
    <span className={`inline-flex items-center whitespace-nowrap rounded-full px-2 py-0.5 text-xs font-medium ${TONES[status]}`}>
      {ORDER_STATUS_LABELS[status]}
      {status === "on-hold" && heldFrom ? ` (${ORDER_STATUS_LABELS[heldFrom].toLowerCase()})` : ""}
    </span>
  );
}

/** "Late" beside an order still on the floor past its due date. */
export function LateBadge() {
  return <span className="inline-flex rounded-full bg-danger-100 px-2 py-0.5 text-xs font-semibold text-danger-700">Late</span>;
}
