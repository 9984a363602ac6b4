"use client";
import { useEffect } from "react";
import { Button } from "./button";

/**
 * What a segment's error.tsx shows when a page fails unexpectedly: the shell around it stays, the
 * page says so plainly and offers to try again (which fetches and renders the segment anew).
 */
export function ErrorPanel({ error, retry }: { error: unknown; retry: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  const digest = error instanceof Error && "digest" in error && typeof error.digest === "string" ? error.digest : null;
  return (
    <section role="alert" className="mx-auto max-w-xl rounded-lg bg-white p-6 shadow-sm ring-1 ring-danger-500/40">
      <p className="text-sm font-semibold uppercase tracking-wide text-danger-700">Something went wrong</p>
      <h1 className="mt-1 text-xl font-semibold">This page could not be shown</h1>
      <p className="mt-2 text-sm text-ink-600">
        Nothing you entered elsewhere is lost. This is usually brief: try again, and if it keeps happening tell the shop
        {digest ? (
          <>
            {" "}
            the reference <span className="font-mono text-ink-800">{digest}</span>
          </>
        ) : null}
        .
      </p>
      <div className="mt-4">
        <Button type="button" onClick={() => retry()}>
          Try again
        </Button>
      </div>
    </section>
  );
}
