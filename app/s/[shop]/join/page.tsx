import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getShopContext } from "@/lib/auth/context";
import { JoinShopForm } from "./_components/join-shop-form";

export const metadata: Metadata = { title: "Create a customer account" };

/** Only a path inside this shop's storefront: never another site, nor another shop's pages. */
function safeNext(next: string | undefined, slug: string) {
  return next && (next === `/s/${slug}` || next.startsWith(`/s/${slug}/`) || next.startsWith(`/s/${slug}?`)) && !/[\\\s]/.test(next) ? next : undefined;
}

export default async function JoinShopPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<{ next?: string }> }) {
  const { shop: slug } = await params;
  const next = safeNext((await searchParams).next, slug);
  const r = await getShopContext(slug);
  if (r.status === "no-shop") notFound();
  const shop = r.status === "ok" ? r.ctx.shop : r.shop;
  return (
    <div className="mx-auto max-w-md">
      <div className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-ink-100">
        <h1 className="text-xl font-semibold">Become a customer of {shop.name}</h1>
        {r.status === "ok" ? (
          <p className="mt-2 text-sm text-ink-600">You are already a member of this shop.</p>
        ) : (
          <>
            <p className="mt-1 text-sm text-ink-600">
              Ask for quotes, accept them and follow your orders. Your account belongs to you; this shop sees your requests, quotes and orders with it.
            </p>
            <div className="mt-6">
              <JoinShopForm slug={slug} next={next} signedInAs={r.status === "not-member" ? r.user.email : null} />
            </div>
          </>
        )}
      </div>
    </div>
  );
}
