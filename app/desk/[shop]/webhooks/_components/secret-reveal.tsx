"use client";
import { useState } from "react";
import { Button } from "@/components/ui/button";

/** A signing secret, shown this once: copy it into the receiving system now. */
export function SecretReveal({ secret, onDone }: { secret: string; onDone: () => void }) {
  const [copied, setCopied] = useState(false);
  return (
    <div role="status" className="space-y-3 rounded-lg bg-hazard-100 p-4 ring-1 ring-hazard-700/20">
      <p className="text-sm font-semibold text-ink-900">Signing secret — shown only now</p>
      <p className="text-sm text-ink-700">
        Store it in the receiving system now: Faradsmith keeps it encrypted and will not show it again. If it is lost, give the endpoint a new secret.
      </p>
      <code data-testid="webhook-secret" className="block break-all rounded bg-white px-3 py-2 font-mono text-sm ring-1 ring-ink-200">
        {secret}
      </code>
      <div className="flex flex-wrap gap-2">
        <Button
          type="button"
          variant="secondary"
          onClick={async () => {
            await navigator.clipboard?.writeText(secret).catch(() => undefined);
            setCopied(true);
          }}
        >
          {copied ? "Copied" : "Copy"}
        </Button>
        <Button type="button" onClick={onDone}>
          I have stored it
        </Button>
      </div>
    </div>
  );
}
