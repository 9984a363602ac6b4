"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { FormMessage, TextField } from "@/components/ui/field";
import { MAX_WEBHOOK_DESCRIPTION_LENGTH, webhookEndpointSchema, type WebhookEndpointInput } from "@/lib/validation/webhooks";
import { SHOP_EVENT_LABELS, SHOP_EVENT_TYPES } from "@/lib/vocabulary";
import { createWebhookEndpoint, updateWebhookEndpoint } from "../actions";
import { SecretReveal } from "./secret-reveal";

/**
 * Registers an endpoint (the secret is then shown once) or changes one. Every field explains
 * itself; the server checks the address again, resolving its name, and puts any refusal on the field.
 */
export function EndpointForm({ shop, endpoint }: { shop: string; endpoint?: WebhookEndpointInput & { id: string } }) {
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string } | null>(null);
  const [created, setCreated] = useState<{ id: string; secret: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<WebhookEndpointInput>({
    resolver: zodResolver(webhookEndpointSchema),
    defaultValues: endpoint ?? { url: "", description: "", events: ["quote.issued", "quote.accepted"] },
  });

  async function submit(values: WebhookEndpointInput) {
    setMessage(null);
    const result = endpoint ? await updateWebhookEndpoint(shop, { ...values, id: endpoint.id }) : await createWebhookEndpoint(shop, values);
    if (!result.ok) {
      for (const [field, messages] of Object.entries(result.fieldErrors ?? {})) setError(field as keyof WebhookEndpointInput, { message: messages[0] });
      setMessage({ tone: "error", text: result.message ?? "Not saved." });
      return;
    }
    if (endpoint) {
      setMessage({ tone: "info", text: "Saved." });
      router.refresh();
      return;
    }
    setCreated(result.data as { id: string; secret: string });
    reset();
  }

  if (created) {
    return (
      <SecretReveal
        secret={created.secret}
        onDone={() => {
          setCreated(null);
          router.push(`/desk/${shop}/webhooks/${created.id}`);
        }}
      />
    );
  }

  const eventsError = formState.errors.events?.message ?? formState.errors.events?.root?.message;
  return (
    <form onSubmit={handleSubmit(submit)} noValidate className="space-y-4" aria-label={endpoint ? "Endpoint settings" : "Add an endpoint"}>
      <TextField
        id="webhook-url"
        label="Address"
        type="url"
        inputMode="url"
        placeholder="https://erp.example.com/hooks/faradsmith"
        hint="Where your system listens: http:// or https:// on a public address (private and internal addresses are refused). It must answer 2xx within 10 s; redirects are not followed."
        error={formState.errors.url?.message}
        {...register("url")}
      />
      <TextField
        id="webhook-description"
        label="Note (optional)"
        hint={`What this endpoint feeds, for whoever reads the log later. At most ${MAX_WEBHOOK_DESCRIPTION_LENGTH} characters.`}
        error={formState.errors.description?.message}
        {...register("description")}
      />
      <fieldset className="space-y-2" aria-describedby="webhook-events-hint">
        <legend className="text-sm font-medium text-ink-800">Events</legend>
        <p id="webhook-events-hint" className="text-xs text-ink-500">
          What this endpoint hears of. Each delivery carries the event&apos;s id: the same event sent twice has the same id.
        </p>
        {SHOP_EVENT_TYPES.map((type) => (
          <label key={type} className="flex items-start gap-2 text-sm">
            <input type="checkbox" value={type} className="mt-1" {...register("events")} />
            <span>
              <code className="font-mono text-xs">{type}</code> — {SHOP_EVENT_LABELS[type]}
            </span>
          </label>
        ))}
        {eventsError ? (
          <p role="alert" className="text-xs font-medium text-danger-700">
            {eventsError}
          </p>
        ) : null}
      </fieldset>
      {message ? <FormMessage tone={message.tone}>{message.text}</FormMessage> : null}
      <Button type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Saving…" : endpoint ? "Save changes" : "Add endpoint"}
      </Button>
    </form>
  );
}
