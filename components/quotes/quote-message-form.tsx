"use client";
import { useRouter } from "next/navigation";
import { useId, useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import type { ActionResult } from "@/lib/auth/guards";
import { MAX_MESSAGE_LENGTH } from "@/lib/validation/limits";

type Send = (shopSlug: string, input: unknown) => Promise<ActionResult<{ id: string }>>;

/**
 * Writing in a quote's thread. A customer may mark the message as asking for a change: the quote
 * then goes back to the shop's estimators. Each message is e-mailed to the other side.
 */
export function QuoteMessageForm({
  shop,
  number,
  send,
  canAskForChange,
  startAsChange = false,
}: {
  shop: string;
  number: string;
  send: Send;
  canAskForChange: boolean;
  startAsChange?: boolean;
}) {
  const router = useRouter();
  const id = useId();
  const [body, setBody] = useState("");
  const [kind, setKind] = useState<"message" | "change-request">(startAsChange && canAskForChange ? "change-request" : "message");
  const [error, setError] = useState<string | null>(null);
  const [status, setStatus] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  return (
    <form
      className="space-y-3"
      aria-label="Write a message"
      onSubmit={(e) => {
        e.preventDefault();
        setError(null);
        setStatus(null);
        startTransition(async () => {
          const r = await send(shop, { number, body, kind });
          if (!r.ok) {
            setError(r.fieldErrors?.body?.[0] ?? r.message ?? "The message was not sent.");
            return;
          }
          setBody("");
          setStatus(kind === "change-request" ? "Sent: the shop will revise the quote and tell you by e-mail." : "Sent.");
          setKind("message");
          router.refresh();
        });
      }}
    >
      {canAskForChange ? (
        <fieldset className="flex flex-wrap gap-4 text-sm">
          <legend className="sr-only">What is this message?</legend>
          <label className="inline-flex items-center gap-2">
            <input type="radio" name={`${id}-kind`} checked={kind === "message"} onChange={() => setKind("message")} /> A question or a note
          </label>
          <label className="inline-flex items-center gap-2">
            <input type="radio" name={`${id}-kind`} checked={kind === "change-request"} onChange={() => setKind("change-request")} /> Ask for a change to the
            quote
          </label>
        </fieldset>
      ) : null}
      <div className="space-y-1">
        <label htmlFor={`${id}-body`} className="block text-sm font-medium text-ink-800">
          {kind === "change-request" ? "What should change?" : "Your message"}
        </label>
        <textarea
          id={`${id}-body`}
          value={body}
          onChange={(e) => setBody(e.target.value)}
          rows={4}
          maxLength={MAX_MESSAGE_LENGTH}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : `${id}-hint`}
          className={`block w-full rounded-md border bg-white px-3 py-2 text-sm ${error ? "border-danger-500" : "border-ink-200"}`}
        />
        {error ? (
          <p id={`${id}-error`} role="alert" className="text-xs font-medium text-danger-700">
            {error}
          </p>
        ) : (
          <p id={`${id}-hint`} className="text-xs text-ink-500">
            E-mailed to the {canAskForChange ? "shop" : "customer"} once; the whole conversation stays here. At most{" "}
            {MAX_MESSAGE_LENGTH.toLocaleString("en-GB")} characters.
          </p>
        )}
      </div>
      <Button type="submit" disabled={pending || body.trim() === ""} aria-busy={pending}>
        {pending ? "Sending…" : kind === "change-request" ? "Ask for the change" : "Send"}
      </Button>
      {status ? <FormMessage tone="info">{status}</FormMessage> : null}
    </form>
  );
}
