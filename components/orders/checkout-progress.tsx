"use client";
import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { api, apiErrorMessage } from "@/lib/api/client";

/** How often the page asks while the payment is being confirmed, and for how long at most. */
const POLL_MS = 1500;
const GIVE_UP_AFTER_MS = 5 * 60 * 1000;

/**
 * The success page's news: "being confirmed" until the payment service's webhook has made the
 * order, then the order's number and a link to it. Polls the checkout's state route (TanStack
 * Query) and stops once the payment is confirmed or has lapsed.
 */
export function CheckoutProgress({ shop, number, sessionId }: { shop: string; number: string; sessionId: string }) {
  const [started] = useState(() => Date.now());
  const { data, error } = useQuery({
    queryKey: ["checkout", shop, number, sessionId],
    queryFn: async () => {
      const { data, error, response } = await api.GET("/api/v1/shops/{shop}/quotes/{number}/checkout", {
        params: { path: { shop, number }, query: { session: sessionId } },
      });
      if (!data) throw new Error(apiErrorMessage(error, response));
      return data;
    },
    refetchInterval: (q) => {
      const d = q.state.data;
      if (d && (d.orderNumber || d.status === "expired")) return false;
      return Date.now() - started > GIVE_UP_AFTER_MS ? false : POLL_MS;
    },
  });
  if (error)
    return (
      <p role="alert" className="text-sm text-danger-700">
        {error.message}
      </p>
    );
  if (data?.orderNumber)
    return (
      <div role="status" className="space-y-3" data-testid="payment-confirmed">
        <p className="text-lg font-semibold">Payment confirmed: order {data.orderNumber} has started.</p>
        <p className="text-sm text-ink-600">A confirmation is on its way to your inbox. You can follow every stage of the build on the order page.</p>
        <Link
          href={`/s/${shop}/orders/${data.orderNumber}`}
          className="inline-flex rounded-md bg-copper-600 px-4 py-2 text-sm font-medium text-white hover:bg-copper-700"
        >
          Follow order {data.orderNumber}
        </Link>
      </div>
    );
  if (data?.status === "expired")
    return (
      <p role="status" className="text-sm">
        This payment page expired before it was paid; nothing was charged.{" "}
        <Link href={`/s/${shop}/quotes/${number}`} className="text-copper-700 hover:underline">
          Back to the quote
        </Link>
      </p>
    );
  return (
    <div role="status" className="flex items-center gap-3" data-testid="payment-confirming">
      <span aria-hidden className="h-4 w-4 animate-spin rounded-full border-2 border-copper-500 border-t-transparent" />
      <p className="text-sm">
        Thank you. Your payment is being confirmed with the payment service; this page updates itself as soon as it is, usually within a few seconds.
      </p>
    </div>
  );
}
