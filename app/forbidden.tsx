import Link from "next/link";

/** Shown (with HTTP 403) when a signed-in person asks for a page their role may not see. */
export default function Forbidden() {
  return (
    <main id="main" className="mx-auto max-w-lg px-4 py-20 text-center">
      <p className="text-sm font-semibold uppercase tracking-wide text-copper-600">Not allowed</p>
      <h1 className="mt-2 text-2xl font-semibold">This page is not open to your role</h1>
      <p className="mt-3 text-sm text-ink-600">
        You are signed in, but your role in this shop does not include this page. If you need it, ask the shop&apos;s manager.
      </p>
      <p className="mt-6 flex justify-center gap-4 text-sm">
        <Link href="/my-shops" className="font-medium text-copper-700 hover:underline">
          Go to your shops
        </Link>
        <Link href="/" className="text-ink-600 hover:underline">
          Front page
        </Link>
      </p>
    </main>
  );
}
