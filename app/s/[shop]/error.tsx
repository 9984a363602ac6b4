"use client";
import { ErrorPanel } from "@/components/ui/error-panel";

/** An unexpected failure in a storefront page: the shell stays, the page offers to try again. */
export default function StorefrontError({ error, retry }: { error: unknown; retry: () => void }) {
  return <ErrorPanel error={error} retry={retry} />;
}
