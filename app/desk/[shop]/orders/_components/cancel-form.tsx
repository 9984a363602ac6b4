"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { FieldShell, FormMessage } from "@/components/ui/field";
import { cancelOrderSchema } from "@/lib/validation/orders";
import type { OrderStatus } from "@/lib/vocabulary";
import { cancelOrder } from "../actions";
import { useActionResult } from "./use-action-form";

const formSchema = cancelOrderSchema.omit({ number: true, from: true, idempotencyKey: true });

/** Cancels an order that has not started kitting, with the reason, and (by default) refunds what was paid. */
export function CancelForm({ shop, number, from, paid, mayRefund }: { shop: string; number: string; from: OrderStatus; paid: string; mayRefund: boolean }) {
  const [key] = useState(() => crypto.randomUUID());
  const { register, handleSubmit, formState, setError } = useForm<z.input<typeof formSchema>, unknown, z.output<typeof formSchema>>({
    resolver: zodResolver(formSchema),
    defaultValues: { note: "", refund: mayRefund },
  });
  const { message, take } = useActionResult(setError);
  const onSubmit = handleSubmit(async (values) => {
    const r = await cancelOrder(shop, { ...values, number, from, idempotencyKey: key });
    take(r, (d) => (d.refunded ? `Cancelled; ${d.refunded} is being refunded.` : "Cancelled."));
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="Cancel the order">
      <FieldShell id="cancel-note" label="Why is it cancelled?" error={formState.errors.note?.message}>
        <textarea id="cancel-note" rows={2} className="block w-full rounded-md border border-ink-200 px-3 py-2 text-sm" {...register("note")} />
      </FieldShell>
      {mayRefund ? (
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...register("refund")} /> Refund the {paid} paid
        </label>
      ) : null}
      <FormMessage tone={message?.tone}>{message?.text}</FormMessage>
      <Button type="submit" variant="danger" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Cancelling…" : "Cancel the order"}
      </Button>
    </form>
  );
}
