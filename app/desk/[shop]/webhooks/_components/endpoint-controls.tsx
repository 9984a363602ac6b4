"use client";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import { deleteWebhookEndpoint, replayWebhookDelivery, rollWebhookSecret, setWebhookEndpointState } from "../actions";
import { SecretReveal } from "./secret-reveal";

/** Stop or start, new secret, delete: each asks first where it cannot be undone. */
export function EndpointControls({ shop, id, state, secretHint }: { shop: string; id: string; state: "active" | "disabled"; secretHint: string }) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [error, setError] = useState<string | null>(null);
  const [secret, setSecret] = useState<string | null>(null);
  const run = (fn: () => Promise<{ ok: boolean; message?: string }>, after?: () => void) =>
    start(async () => {
      setError(null);
      const r = await fn();
      if (!r.ok) setError(r.message ?? "That did not work.");
      else (after ?? (() => router.refresh()))();
    });

  if (secret) return <SecretReveal secret={secret} onDone={() => setSecret(null)} />;
  return (
    <div className="space-y-3">
      <p className="text-sm text-ink-700">
        Signing secret: <code className="font-mono">{secretHint}</code>
      </p>
      <div className="flex flex-wrap gap-2">
        <Button
          type="button"
          variant="secondary"
          disabled={pending}
          onClick={() => run(() => setWebhookEndpointState(shop, { id, state: state === "active" ? "disabled" : "active" }))}
        >
          {state === "active" ? "Stop sending" : "Start sending"}
        </Button>
        <Button
          type="button"
          variant="secondary"
          disabled={pending}
          onClick={() => {
            if (!window.confirm("Give this endpoint a new signing secret? The current one stops working at once.")) return;
            start(async () => {
              const r = await rollWebhookSecret(shop, { id });
              if (r.ok) setSecret(r.data.secret);
              else setError(r.message ?? "No new secret was made.");
            });
          }}
        >
          New secret
        </Button>
        <Button
          type="button"
          variant="danger"
          disabled={pending}
          onClick={() => {
            if (!window.confirm("Delete this endpoint and its delivery log? Nothing more is sent to it.")) return;
            run(
              () => deleteWebhookEndpoint(shop, { id }),
              () => router.push(`/desk/${shop}/webhooks`),
            );
          }}
        >
          Delete
        </Button>
      </div>
      {error ? <FormMessage>{error}</FormMessage> : null}
    </div>
  );
}

/** Sends one logged event to the endpoint again (same event id), as a new delivery. */
export function ReplayButton({ shop, deliveryId }: { shop: string; deliveryId: string }) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [message, setMessage] = useState<string | null>(null);
  return (
    <span className="inline-flex items-center gap-2">
      <button
        type="button"
        disabled={pending}
        className="whitespace-nowrap text-sm font-medium text-copper-700 hover:underline disabled:text-ink-300"
        onClick={() =>
          start(async () => {
            const r = await replayWebhookDelivery(shop, { deliveryId });
            setMessage(r.ok ? "Queued" : (r.message ?? "Not queued"));
            if (r.ok) router.refresh();
          })
        }
      >
        Send again
      </button>
      {message ? (
        <span role="status" className="text-xs text-ink-600">
          {message}
        </span>
      ) : null}
    </span>
  );
}
