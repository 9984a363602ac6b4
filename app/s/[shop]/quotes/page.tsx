import type { Metadata } from "next";
import { Placeholder } from "@/components/ui/placeholder";
import { requireShopPage } from "@/lib/auth/context";

export const metadata: Metadata = { title: "My quotes" };

export default async function MyQuotesPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "quote:read-own", `/s/${shop}/quotes`);
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-semibold">My quotes</h1>
      <p className="text-sm text-ink-600">Signed in as {ctx.user.email}.</p>
      <Placeholder title="Your quotes and orders">
        <p>Every quote {ctx.shop.name} sends you will be listed here — number, revision, arrangement, total and validity — with its PDF, and the orders you placed with their build status.</p>
      </Placeholder>
    </div>
  );
}
