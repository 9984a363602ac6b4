import { headers } from "next/headers";
import Link from "next/link";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { Logo } from "@/components/brand/logo";
import { requireShopPage } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/vocabulary";
import { DeskNav } from "./_components/desk-nav";
import { DESK_SECTIONS } from "./_components/desk-sections";

/** The staff desk shell: navigation by role. Each page checks its own permission as well. */
export default async function DeskLayout({ children, params }: { children: React.ReactNode; params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  // signed out, sign in and come back to the page asked for (proxy.ts names it), not the desk's home
  const asked = (await headers()).get("x-request-path");
  const ctx = await requireShopPage(shop, "desk:enter", asked?.startsWith(`/desk/${shop}`) ? asked : undefined);
  const items = DESK_SECTIONS.filter((s) => can(ctx.role, s.permission)).map(({ path, label }) => ({ path, label }));
  return (
    <div className="min-h-screen md:flex">
      <aside className="bg-ink-900 text-white md:w-60 md:shrink-0">
        <div className="space-y-4 p-4">
          <Logo href={`/desk/${shop}`} subtitle={ctx.shop.name} />
          <DeskNav slug={shop} items={items} />
        </div>
      </aside>
      <div className="flex-1">
        <header className="flex flex-wrap items-center justify-between gap-2 border-b border-ink-200 bg-white px-6 py-3 text-sm">
          <Link href={`/s/${shop}`} className="text-ink-600 hover:underline">
            View storefront
          </Link>
          <div className="flex items-center gap-4">
            <span>
              {ctx.user.name} · <span className="text-ink-500">{ROLE_LABELS[ctx.role]}</span>
            </span>
            <SignOutButton />
          </div>
        </header>
        <main id="main" className="p-6">
          {children}
        </main>
      </div>
    </div>
  );
}
