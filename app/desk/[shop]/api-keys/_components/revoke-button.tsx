"use client";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { revokeApiKey } from "../actions";

/** Revokes a key after a second click; its next request is refused. */
export function RevokeButton({ shop, id, name }: { shop: string; id: string; name: string }) {
  const router = useRouter();
  const [confirming, setConfirming] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [busy, start] = useTransition();
  return (
    <span className="inline-flex flex-wrap items-center gap-2">
      <Button
        type="button"
        variant={confirming ? "danger" : "secondary"}
        disabled={busy}
        aria-label={confirming ? `Confirm: revoke ${name}` : `Revoke ${name}`}
        onClick={() => {
          if (!confirming) {
            setConfirming(true);
            return;
          }
          start(async () => {
            const r = await revokeApiKey(shop, { id });
            if (!r.ok) setError(r.message ?? "Not revoked.");
            router.refresh();
          });
        }}
      >
        {confirming ? "Revoke now" : "Revoke"}
      </Button>
      {error ? (
        <span role="alert" className="text-xs text-danger-700">
          {error}
        </span>
      ) : null}
    </span>
  );
}
