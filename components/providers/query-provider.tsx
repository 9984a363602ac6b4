"use client";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useState } from "react";

/** The one TanStack Query client of a browser tab. */
export function QueryProvider({ children }: { children: React.ReactNode }) {
  const [client] = useState(
    () =>
      new QueryClient({
        defaultOptions: { queries: { staleTime: 30_000, retry: (count, error) => count < 2 && !(error instanceof Error && "status" in error && (error as { status: number }).status < 500) } },
      }),
  );
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
