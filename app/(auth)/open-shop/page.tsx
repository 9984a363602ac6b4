import type { Metadata } from "next";
import { Logo } from "@/components/brand/logo";
import { OpenShopForm } from "./_components/open-shop-form";

export const metadata: Metadata = { title: "Open a shop" };

export default function OpenShopPage() {
  return (
    <main id="main" className="mx-auto max-w-xl px-4 py-10">
      <Logo />
      <div className="mt-6 rounded-lg bg-white p-6 shadow-sm ring-1 ring-ink-100">
        <h1 className="text-xl font-semibold">Open a shop on Faradsmith</h1>
        <p className="mt-1 text-sm text-ink-600">
          You become the shop&apos;s manager. Your storefront lives at its own address; you add your catalog, pricing rules and team from the desk.
        </p>
        <div className="mt-6">
          <OpenShopForm />
        </div>
      </div>
    </main>
  );
}
