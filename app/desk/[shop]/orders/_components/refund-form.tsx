"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { FieldShell, FormMessage, TextField } from "@/components/ui/field";
import { formatMoney } from "@/lib/pricing/currency";
import { refundOrderSchema } from "@/lib/validation/orders";
import { refundOrder } from "../actions";
import { useActionResult } from "./use-action-form";

const formSchema = refundOrderSchema.omit({ number: true, idempotencyKey: true });

/**
 * Refunds part or all of what is left, with the reason the customer's order shows. Each submit
 * carries one key, so a double click refunds once; the order's amounts follow the payment service.
 */
export function RefundForm({ shop, number, left, currency }: { shop: string; number: string; left: string; currency: string }) {
  const [key, setKey] = useState(() => crypto.randomUUID());
  const { register, handleSubmit, formState, setError, getValues, reset } = useForm<z.input<typeof formSchema>, unknown, z.output<typeof formSchema>>({
    resolver: zodResolver(formSchema),
    defaultValues: { amount: "", reason: "" },
  });
  const { message, take } = useActionResult(setError);
  const onSubmit = handleSubmit(async () => {
    const r = await refundOrder(shop, { ...getValues(), number, idempotencyKey: key });
    if (take(r, (d) => `Refund of ${formatMoney(d.requested, d.currency)} sent to the payment service; the order updates when it confirms.`)) {
      reset({ amount: "", reason: "" });
      setKey(crypto.randomUUID());
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="Refund">
      <TextField
        id="refund-amount"
        label={`Amount (${currency})`}
        inputMode="decimal"
        hint={`Up to ${formatMoney(left, currency)} is left to refund.`}
        error={formState.errors.amount?.message}
        {...register("amount")}
      />
      <FieldShell id="refund-reason" label="Reason" hint="Required; the customer sees it on the order." error={formState.errors.reason?.message}>
        <textarea id="refund-reason" rows={2} className="block w-full rounded-md border border-ink-200 px-3 py-2 text-sm" {...register("reason")} />
      </FieldShell>
      <FormMessage tone={message?.tone}>{message?.text}</FormMessage>
      <Button type="submit" variant="secondary" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Refunding…" : "Refund"}
      </Button>
    </form>
  );
}
