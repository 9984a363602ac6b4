import Link from "next/link";
import { notFound } from "next/navigation";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { getShopContext } from "@/lib/auth/context";

/** The customer's storefront shell: the shop's name, and who is signed in. */
export default async function StorefrontLayout({ children, params }: { children: React.ReactNode; params: Promise<{ shop: string }> }) {
  const { shop: slug } = await params;
  const r = await getShopContext(slug);
  if (r.status === "no-shop") notFound();
  const shop = r.status === "ok" ? r.ctx.shop : r.shop;
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-ink-200 bg-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-4 py-3">
          <div className="flex items-center gap-3">
            <Link href="/" aria-label="Faradsmith home">
              <img src="/logo-mark.svg" alt="" width={28} height={28} />
            </Link>
            <Link href={`/s/${slug}`} className="text-lg font-semibold tracking-tight">
              {shop?.name}
            </Link>
          </div>
          <nav aria-label="Storefront" className="flex flex-wrap items-center gap-4 text-sm">
            <Link href={`/s/${slug}`} className="hover:underline">
              Design a bank
            </Link>
            {r.status === "ok" ? (
              <>
                {r.ctx.role === "customer" ? (
                  <>
                    <Link href={`/s/${slug}/quotes`} className="hover:underline">
                      My quotes
                    </Link>
                    <Link href={`/s/${slug}/orders`} className="hover:underline">
                      My orders
                    </Link>
                  </>
                ) : (
                  <Link href={`/desk/${slug}`} className="hover:underline">
                    Staff desk
                  </Link>
                )}
                <span className="text-ink-500">{r.ctx.user.name}</span>
                <SignOutButton to={`/s/${slug}`} />
              </>
            ) : r.status === "not-member" ? (
              <>
                <Link href={`/s/${slug}/join`} className="hover:underline">
                  Join as a customer
                </Link>
                <SignOutButton to={`/s/${slug}`} />
              </>
            ) : (
              <>
                <Link href={`/sign-in?shop=${slug}&next=/s/${slug}`} className="hover:underline">
                  Sign in
                </Link>
                <Link href={`/s/${slug}/join`} className="rounded-md bg-copper-600 px-3 py-1.5 font-medium text-white hover:bg-copper-700">
                  Create an account
                </Link>
              </>
            )}
          </nav>
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-8">
        {children}
      </main>
      <footer className="border-t border-ink-200 bg-white py-4 text-center text-xs text-ink-500">
        {shop?.name} · quotes by{" "}
        <Link href="/" className="hover:underline">
          Faradsmith
        </Link>
      </footer>
    </div>
  );
}
