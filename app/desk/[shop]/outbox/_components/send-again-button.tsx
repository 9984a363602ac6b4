"use client";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { requeueMessage } from "../actions";

/** "Send again" on a failed message: queues it anew, then refreshes the list to show it waiting. */
export function SendAgainButton({ shop, outboxId, subject }: { shop: string; outboxId: string; subject: string }) {
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [pending, startTransition] = useTransition();
  return (
    <div className="mt-1 flex flex-wrap items-center gap-2">
      <button
        type="button"
        disabled={pending}
        aria-label={`Send again: ${subject}`}
        className="rounded-md border border-ink-300 bg-white px-2 py-1 text-xs font-medium text-ink-800 hover:bg-ink-50 disabled:opacity-60"
        onClick={() => {
          setMessage(null);
          startTransition(async () => {
            const r = await requeueMessage(shop, { outboxId });
            if (r.ok) {
              setMessage({ tone: "ok", text: "Queued again" });
              router.refresh();
            } else setMessage({ tone: "error", text: r.message ?? "Not queued" });
          });
        }}
      >
        {pending ? "Queuing…" : "Send again"}
      </button>
      {message ? (
        <span role="status" className={`text-xs ${message.tone === "ok" ? "text-charge-700" : "text-danger-700"}`}>
          {message.text}
        </span>
      ) : null}
    </div>
  );
}
