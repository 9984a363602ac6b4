import type { Metadata } from "next";
import { Logo } from "@/components/brand/logo";
import { SignInForm } from "./_components/sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

function safeNext(next: string | undefined) {
  return next && next.startsWith("/") && !next.startsWith("//") ? next : undefined;
}

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string; shop?: string }> }) {
  const sp = await searchParams;
  const shop = sp.shop && /^[a-z0-9-]{1,40}$/.test(sp.shop) ? sp.shop : undefined;
  return (
    <main id="main" className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-4 py-10">
      <div className="mb-6 text-ink-900">
        <Logo />
      </div>
      <div className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-ink-100">
        <h1 className="text-xl font-semibold">Sign in</h1>
        <p className="mt-1 text-sm text-ink-600">Staff go to their shop&apos;s desk; customers to their storefront.</p>
        <div className="mt-6">
          <SignInForm next={safeNext(sp.next)} shop={shop} />
        </div>
      </div>
    </main>
  );
}
