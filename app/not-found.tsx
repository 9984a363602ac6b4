import Link from "next/link";

export default function NotFound() {
  return (
    <main id="main" className="mx-auto max-w-lg px-4 py-20 text-center">
      <p className="text-sm font-semibold uppercase tracking-wide text-copper-600">Not found</p>
      <h1 className="mt-2 text-2xl font-semibold">There is nothing at this address</h1>
      <p className="mt-3 text-sm text-ink-600">The shop or page may have moved, or the link may be mistyped.</p>
      <p className="mt-6 text-sm">
        <Link href="/" className="font-medium text-copper-700 hover:underline">
          Front page
        </Link>
      </p>
    </main>
  );
}
