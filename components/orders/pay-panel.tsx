"use client";
import { useState, useTransition } from "react";
import { startCheckout } from "@/app/s/[shop]/quotes/[number]/actions";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import type { PaymentKind } from "@/lib/vocabulary";

export interface PayChoice {
  kind: PaymentKind;
  label: string;
  /** formatted in the shop's currency */
  amount: string;
  hint?: string;
}

/**
 * Pays a quote on the payment service's page: the customer picks the whole amount or the deposit
 * (or the balance), and the button opens the checkout (`startCheckout`), then goes there.
 */
export function PayPanel({
  shop,
  number,
  revision,
  choices,
  action,
}: {
  shop: string;
  number: string;
  revision: number;
  choices: PayChoice[];
  /** the button's words: "Accept and pay" before acceptance, "Pay" after */
  action: string;
}) {
  const [kind, setKind] = useState<PaymentKind>(choices[0]?.kind ?? "full");
  const [error, setError] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  const chosen = choices.find((c) => c.kind === kind) ?? choices[0];
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        setError(null);
        startTransition(async () => {
          const r = await startCheckout(shop, { number, revision, kind });
          if (r.ok) window.location.assign(r.data.url);
          else setError(r.message ?? "The payment could not be started.");
        });
      }}
    >
      {choices.length > 1 ? (
        <fieldset>
          <legend className="text-sm font-medium text-ink-800">What would you like to pay now?</legend>
          <div className="mt-2 grid gap-2 sm:grid-cols-2">
            {choices.map((c) => (
              <label
                key={c.kind}
                className={`flex cursor-pointer items-start gap-2 rounded-md p-3 ring-1 ${kind === c.kind ? "bg-copper-50 ring-copper-500" : "bg-white ring-ink-200"}`}
              >
                <input type="radio" name="kind" value={c.kind} checked={kind === c.kind} onChange={() => setKind(c.kind)} className="mt-1" />
                <span>
                  <span className="block text-sm font-medium">{c.label}</span>
                  <span className="num block text-lg font-semibold">{c.amount}</span>
                  {c.hint ? <span className="block text-xs text-ink-600">{c.hint}</span> : null}
                </span>
              </label>
            ))}
          </div>
        </fieldset>
      ) : null}
      <FormMessage>{error}</FormMessage>
      <Button type="submit" disabled={pending || !chosen}>
        {pending ? "Opening the payment page…" : `${action} ${chosen?.amount ?? ""}`}
      </Button>
    </form>
  );
}
