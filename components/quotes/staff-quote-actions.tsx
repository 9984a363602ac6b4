"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useId, useState, useTransition } from "react";
import { Button, buttonClass } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import type { ActionResult } from "@/lib/auth/guards";
import { MAX_MESSAGE_LENGTH } from "@/lib/validation/limits";

type Move = (shopSlug: string, input: unknown) => Promise<ActionResult<unknown>>;

/** The staff's moves on a quote: revise it in the workbench, send its e-mail again, withdraw the open revision. */
export function StaffQuoteActions({
  shop,
  number,
  workbenchHref,
  canResend,
  canWithdraw,
  resend,
  withdraw,
}: {
  shop: string;
  number: string;
  /** null when the quote cannot be revised (accepted) */
  workbenchHref: string | null;
  canResend: boolean;
  canWithdraw: boolean;
  resend: Move;
  withdraw: Move;
}) {
  const router = useRouter();
  const id = useId();
  const [withdrawing, setWithdrawing] = useState(false);
  const [reason, setReason] = useState("");
  const [message, setMessage] = useState<{ tone: "info" | "error"; text: string } | null>(null);
  const [pending, startTransition] = useTransition();
  const run = (move: Move, input: unknown, done: string) =>
    startTransition(async () => {
      setMessage(null);
      const r = await move(shop, input);
      if (!r.ok) {
        setMessage({ tone: "error", text: r.fieldErrors?.reason?.[0] ?? r.message ?? "That did not work; try again." });
        return;
      }
      setWithdrawing(false);
      setReason("");
      setMessage({ tone: "info", text: done });
      router.refresh();
    });
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap gap-2">
        {workbenchHref ? (
          <Link href={workbenchHref} className={buttonClass("primary")}>
            Revise in the workbench
          </Link>
        ) : null}
        {canResend ? (
          <Button
            type="button"
            variant="secondary"
            disabled={pending}
            onClick={() => run(resend, { number }, "The quote's e-mail is on its way to the customer again.")}
          >
            Send the e-mail again
          </Button>
        ) : null}
        {canWithdraw && !withdrawing ? (
          <Button type="button" variant="quiet" onClick={() => setWithdrawing(true)}>
            Withdraw…
          </Button>
        ) : null}
      </div>
      {withdrawing ? (
        <form
          className="space-y-2"
          onSubmit={(e) => {
            e.preventDefault();
            run(withdraw, { number, reason }, "Withdrawn; the customer is told in the thread.");
          }}
        >
          <label htmlFor={`${id}-reason`} className="block text-sm font-medium text-ink-800">
            Why does the shop withdraw this revision? (the customer reads it)
          </label>
          <textarea
            id={`${id}-reason`}
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            rows={2}
            maxLength={MAX_MESSAGE_LENGTH}
            className="block w-full rounded-md border border-ink-200 bg-white px-3 py-2 text-sm"
          />
          <div className="flex gap-2">
            <Button type="submit" variant="danger" disabled={pending || reason.trim().length < 3}>
              Withdraw it
            </Button>
            <Button type="button" variant="secondary" onClick={() => setWithdrawing(false)}>
              Cancel
            </Button>
          </div>
        </form>
      ) : null}
      {message ? <FormMessage tone={message.tone}>{message.text}</FormMessage> : null}
    </div>
  );
}
