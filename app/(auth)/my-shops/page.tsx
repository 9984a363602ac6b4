import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { Logo } from "@/components/brand/logo";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { listShopsOfUser } from "@/db/queries/members";
import { getSessionUser } from "@/lib/auth/context";
import { ROLE_LABELS } from "@/lib/vocabulary";

export const metadata: Metadata = { title: "Your shops" };

const homeOf = (slug: string, role: string) => (role === "customer" ? `/s/${slug}` : `/desk/${slug}`);

/** Where a signed-in person lands: straight into their only shop, or a choice of shops. */
export default async function MyShopsPage({ searchParams }: { searchParams: Promise<{ shop?: string }> }) {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  const { shop } = await searchParams;
  const rows = await listShopsOfUser(user.id);
  const preferred = rows.find((r) => r.slug === shop) ?? (rows.length === 1 ? rows[0] : undefined);
  if (preferred) redirect(homeOf(preferred.slug, preferred.role));
  return (
    <main id="main" className="mx-auto max-w-lg px-4 py-10">
      <Logo />
      <h1 className="mt-8 text-xl font-semibold">Your shops</h1>
      {rows.length === 0 ? (
        <p className="mt-2 text-sm text-ink-600">
          You are not a member of any shop yet.{" "}
          <Link href="/open-shop" className="text-copper-700 hover:underline">
            Open a shop
          </Link>{" "}
          or visit a shop&apos;s storefront from the{" "}
          <Link href="/" className="text-copper-700 hover:underline">
            front page
          </Link>
          .
        </p>
      ) : (
        <ul className="mt-4 space-y-2">
          {rows.map((r) => (
            <li key={r.slug} className="flex items-center justify-between rounded-md bg-white p-3 ring-1 ring-ink-100">
              <Link href={homeOf(r.slug, r.role)} className="font-medium hover:underline">
                {r.name}
              </Link>
              <span className="text-xs text-ink-500">{ROLE_LABELS[r.role]}</span>
            </li>
          ))}
        </ul>
      )}
      <p className="mt-6">
        <SignOutButton />
      </p>
    </main>
  );
}
