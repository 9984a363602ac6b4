"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";

/** Signing out is rare: the auth client loads on the click, not with every page that shows the button. */
export function SignOutButton({ to = "/", className = "" }: { to?: string; className?: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  return (
    <button
      type="button"
      disabled={busy}
      className={`text-sm underline-offset-4 hover:underline ${className}`}
      onClick={async () => {
        setBusy(true);
        const { authClient } = await import("@/lib/auth/client");
        await authClient.signOut();
        router.push(to);
        router.refresh();
      }}
    >
      {busy ? "Signing out…" : "Sign out"}
    </button>
  );
}
