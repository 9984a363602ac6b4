"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useId, useState, useTransition } from "react";
import { Button, buttonClass } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import type { ActionResult } from "@/lib/auth/guards";
import { MAX_MESSAGE_LENGTH } from "@/lib/validation/limits";

type Move = (shopSlug: string, input: unknown) => Promise<ActionResult<unknown>>;

/**
 * The customer's choices on the latest sent revision: accept it (after saying so twice), decline it
 * with a reason, or ask for a change (in the thread below).
 */
export function CustomerQuoteActions({
  shop,
  number,
  revision,
  total,
  validUntil,
  accept,
  decline,
  askHref,
}: {
  shop: string;
  number: string;
  revision: number;
  total: string;
  validUntil: string;
  accept: Move;
  decline: Move;
  /** the thread's form, set to ask for a change */
  askHref: string;
}) {
  const router = useRouter();
  const id = useId();
  const [step, setStep] = useState<"choose" | "confirm" | "decline">("choose");
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  const run = (move: Move, input: unknown) =>
    startTransition(async () => {
      setError(null);
      const r = await move(shop, input);
      if (!r.ok) {
        setError(r.fieldErrors?.reason?.[0] ?? r.message ?? "That did not work; try again.");
        return;
      }
      setStep("choose");
      router.refresh();
    });

  if (step === "confirm") {
    return (
      <div className="space-y-3" role="group" aria-labelledby={`${id}-confirm`}>
        <p id={`${id}-confirm`} className="text-sm text-ink-800">
          Accept revision {revision} of {number} for <strong className="num">{total}</strong>? The shop builds to this revision; it holds until {validUntil}.
        </p>
        <div className="flex flex-wrap gap-2">
          <Button type="button" onClick={() => run(accept, { number, revision })} disabled={pending} aria-busy={pending}>
            {pending ? "Accepting…" : `Yes, accept revision ${revision}`}
          </Button>
          <Button type="button" variant="secondary" onClick={() => setStep("choose")} disabled={pending}>
            Not yet
          </Button>
        </div>
        <FormMessage>{error}</FormMessage>
      </div>
    );
  }
  if (step === "decline") {
    return (
      <form
        className="space-y-3"
        onSubmit={(e) => {
          e.preventDefault();
          run(decline, { number, revision, reason });
        }}
      >
        <div className="space-y-1">
          <label htmlFor={`${id}-reason`} className="block text-sm font-medium text-ink-800">
            Why do you decline revision {revision}?
          </label>
          <textarea
            id={`${id}-reason`}
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            rows={3}
            maxLength={MAX_MESSAGE_LENGTH}
            required
            aria-invalid={error ? true : undefined}
            aria-describedby={`${id}-reason-hint`}
            className={`block w-full rounded-md border bg-white px-3 py-2 text-sm ${error ? "border-danger-500" : "border-ink-200"}`}
          />
          <p id={`${id}-reason-hint`} className="text-xs text-ink-500">
            The shop reads this; it may offer a new revision.
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          <Button type="submit" variant="danger" disabled={pending || reason.trim().length < 3} aria-busy={pending}>
            {pending ? "Declining…" : "Decline this revision"}
          </Button>
          <Button type="button" variant="secondary" onClick={() => setStep("choose")} disabled={pending}>
            Keep it open
          </Button>
        </div>
        <FormMessage>{error}</FormMessage>
      </form>
    );
  }
  return (
    <div className="flex flex-wrap gap-2">
      <Button type="button" onClick={() => setStep("confirm")}>
        Accept revision {revision}
      </Button>
      <Link href={askHref} className={buttonClass("secondary")}>
        Ask for a change
      </Link>
      <Button type="button" variant="quiet" onClick={() => setStep("decline")}>
        Decline
      </Button>
    </div>
  );
}
