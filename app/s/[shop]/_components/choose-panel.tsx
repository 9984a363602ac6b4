"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { Button, buttonClass } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import type { Requirement } from "@/lib/bank";
import type { ChosenOption } from "@/lib/validation/quote";
import { chooseArrangement } from "../actions";
import type { Viewer } from "./viewer";

/** What the customer is shown before a quote is issued and e-mailed. */
export interface ChoiceSummary {
  /** e.g. "KC-3000: 18 S × 2 P, string of parallel groups" */
  title: string;
  quantity: number;
  /** the total as shown ("€1,208.30"), or null when the option has no price */
  total: string | null;
  validityDays: number;
}

/**
 * Choosing an arrangement (or, with no option, sending the request for review). Visitors are sent to
 * sign in or sign up and come back to the same search; customers get a quote or a review notice.
 * One idempotency key per choice, kept while retrying, so a double submit makes one quote. A customer
 * choosing an option first sees what will be quoted (the arrangement, quantity, total, validity)
 * and confirms: the quote is issued and e-mailed at once.
 */
export function ChoosePanel({
  slug,
  viewer,
  choiceId,
  option,
  requirement,
  notes,
  attachmentIds,
  onBeforeSignIn,
  onQuoted,
  summary = null,
}: {
  slug: string;
  viewer: Viewer;
  /** the option's id, or "review" */
  choiceId: string;
  option: ChosenOption | null;
  requirement: Requirement & { quantity: number };
  notes: string;
  attachmentIds: string[];
  onBeforeSignIn: () => void;
  onQuoted: () => void;
  summary?: ChoiceSummary | null;
}) {
  const router = useRouter();
  const keys = useRef(new Map<string, string>());
  const inFlight = useRef(false);
  const [pending, setPending] = useState(false);
  const [askSignIn, setAskSignIn] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [review, setReview] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const label = option ? "Choose this arrangement" : "Send to the shop for review";
  const back = `/s/${slug}?resume=1`;

  if (review) {
    return (
      <p role="status" className="rounded-md bg-charge-100 px-4 py-3 text-sm text-charge-700" data-testid="review-notice">
        Sent to the shop&apos;s estimators; you will hear by e-mail.
      </p>
    );
  }

  async function choose(confirmed = false) {
    if (inFlight.current) return;
    if (viewer.kind === "visitor" || viewer.kind === "not-member") {
      onBeforeSignIn();
      setAskSignIn(true);
      return;
    }
    if (summary && !confirmed) {
      setConfirming(true);
      return;
    }
    inFlight.current = true;
    setPending(true);
    setMessage(null);
    let key = keys.current.get(choiceId);
    if (!key) {
      key = crypto.randomUUID();
      keys.current.set(choiceId, key);
    }
    try {
      const r = await chooseArrangement(slug, { idempotencyKey: key, requirement, notes, attachmentIds, ...(option ? { option } : {}) });
      if (!r.ok) {
        if (r.code === "unauthenticated") {
          onBeforeSignIn();
          setAskSignIn(true);
        } else setMessage(r.message ?? "That did not work; try again.");
        return;
      }
      if (r.data.kind === "quote") {
        onQuoted();
        router.push(`/s/${slug}/quotes/${encodeURIComponent(r.data.quoteNumber)}`);
        return;
      }
      setReview(true);
    } catch {
      setMessage("The shop could not be reached; try again (your choice is only made once).");
    } finally {
      inFlight.current = false;
      setPending(false);
    }
  }

  return (
    <div className="space-y-3">
      {viewer.kind === "staff" ? (
        <p className="text-sm text-ink-600">You are signed in as staff ({viewer.email}); quotes are requested from a customer account.</p>
      ) : confirming && summary ? (
        <section
          aria-labelledby={`confirm-${choiceId}`}
          className="max-w-sm rounded-md bg-copper-50 px-4 py-3 text-sm ring-1 ring-copper-100"
          data-testid="choice-review"
        >
          <h4 id={`confirm-${choiceId}`} className="font-semibold text-ink-900">
            Your quote will be
          </h4>
          <dl className="mt-2 space-y-1">
            <div className="flex justify-between gap-4">
              <dt className="text-ink-600">Bank</dt>
              <dd className="text-right font-medium">{summary.title}</dd>
            </div>
            <div className="flex justify-between gap-4">
              <dt className="text-ink-600">Quantity</dt>
              <dd className="num text-right font-medium">{summary.quantity}</dd>
            </div>
            <div className="flex justify-between gap-4">
              <dt className="text-ink-600">Total</dt>
              <dd className="num text-right font-medium">{summary.total ?? "priced by the shop"}</dd>
            </div>
            <div className="flex justify-between gap-4">
              <dt className="text-ink-600">Valid for</dt>
              <dd className="num text-right font-medium">
                {summary.validityDays} {summary.validityDays === 1 ? "day" : "days"}
              </dd>
            </div>
          </dl>
          <p className="mt-2 text-xs text-ink-600">
            Confirming issues the numbered quote and e-mails it to you (a bank beyond what the shop quotes automatically goes to its estimators first). Nothing
            is ordered or paid yet.
          </p>
          <div className="mt-3 flex flex-wrap gap-2">
            <Button type="button" onClick={() => void choose(true)} disabled={pending} aria-busy={pending}>
              {pending ? "Preparing your quote…" : "Confirm and get the quote"}
            </Button>
            <Button type="button" variant="secondary" disabled={pending} onClick={() => setConfirming(false)}>
              Back
            </Button>
          </div>
        </section>
      ) : (
        <Button type="button" onClick={() => void choose()} disabled={pending} aria-busy={pending}>
          {pending ? (option ? "Preparing your quote…" : "Sending…") : label}
        </Button>
      )}
      {askSignIn ? (
        <div role="status" className="rounded-md bg-ink-50 px-4 py-3 text-sm text-ink-800 ring-1 ring-ink-100" data-testid="sign-in-prompt">
          <p>
            {viewer.kind === "not-member"
              ? `You are signed in as ${viewer.email} but not yet a customer of this shop.`
              : "To choose, sign in or create a customer account. What you entered is kept and you come back to this arrangement."}
          </p>
          <div className="mt-3 flex flex-wrap gap-2">
            {viewer.kind === "visitor" ? (
              <Link className={buttonClass("secondary")} href={`/sign-in?shop=${slug}&next=${encodeURIComponent(back)}`}>
                Sign in
              </Link>
            ) : null}
            <Link className={buttonClass("primary")} href={`/s/${slug}/join?next=${encodeURIComponent(back)}`}>
              {viewer.kind === "not-member" ? "Join as a customer" : "Create a customer account"}
            </Link>
          </div>
        </div>
      ) : null}
      <FormMessage>{message}</FormMessage>
    </div>
  );
}
