"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { FieldShell, FormMessage, SelectField, TextField } from "@/components/ui/field";
import type { z } from "zod";
import { moveOrderFormSchema, MAX_ORDER_NOTE_LENGTH } from "@/lib/validation/orders";
import { ORDER_STATUS_LABELS, type OrderStatus } from "@/lib/vocabulary";
import { moveOrder } from "../actions";
import { useActionResult } from "./use-action-form";

/** Moves an order one step: only the moves allowed from where it stands; shipping asks for the carrier and tracking reference. */
export function MoveForm({ shop, number, from, moves }: { shop: string; number: string; from: OrderStatus; moves: OrderStatus[] }) {
  const { register, handleSubmit, watch, formState, setError, reset } = useForm<
    z.input<typeof moveOrderFormSchema>,
    unknown,
    z.output<typeof moveOrderFormSchema>
  >({
    resolver: zodResolver(moveOrderFormSchema),
    defaultValues: { to: moves[0] ?? from, note: "", carrier: "", trackingReference: "" },
  });
  const { message, take } = useActionResult(setError);
  const to = watch("to");
  const onSubmit = handleSubmit(async (values) => {
    const r = await moveOrder(shop, { ...values, number, from });
    if (take(r, (d) => `Moved to ${ORDER_STATUS_LABELS[d.status].toLowerCase()}.`)) reset({ to: values.to, note: "", carrier: "", trackingReference: "" });
  });
  if (moves.length === 0) return <p className="text-sm text-ink-600">This order is {ORDER_STATUS_LABELS[from].toLowerCase()}: it moves no further.</p>;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="Move the order">
      <SelectField id="move-to" label="Move to" error={formState.errors.to?.message} {...register("to")}>
        {moves.map((m) => (
          <option key={m} value={m}>
            {ORDER_STATUS_LABELS[m]}
          </option>
        ))}
      </SelectField>
      {to === "shipped" ? (
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField id="move-carrier" label="Carrier" error={formState.errors.carrier?.message} {...register("carrier")} />
          <TextField id="move-tracking" label="Tracking reference" error={formState.errors.trackingReference?.message} {...register("trackingReference")} />
        </div>
      ) : null}
      <FieldShell
        id="move-note"
        label="Note (optional)"
        hint={`Up to ${MAX_ORDER_NOTE_LENGTH} characters; kept in the order's history.`}
        error={formState.errors.note?.message}
      >
        <textarea id="move-note" rows={2} className="block w-full rounded-md border border-ink-200 px-3 py-2 text-sm" {...register("note")} />
      </FieldShell>
      <FormMessage tone={message?.tone}>{message?.text}</FormMessage>
      <Button type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Moving…" : `Move to ${ORDER_STATUS_LABELS[to]?.toLowerCase() ?? "…"}`}
      </Button>
    </form>
  );
}
