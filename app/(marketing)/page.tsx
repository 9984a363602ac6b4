import Link from "next/link";
import { Logo } from "@/components/brand/logo";
import { buttonClass } from "@/components/ui/button";
import { listPublicShops } from "@/db/queries/shops";

export const dynamic = "force-dynamic";

const steps = [
  {
    title: "State what the bank must do",
    body: "Working and minimum voltage, capacitance or usable energy or backup time, peak current, size and mass limits, quantity.",
  },
  {
    title: "See buildable arrangements",
    body: "Series and parallel layouts from the shop's own stock, with balancing and bleeder resistors, worst-case cell stress and safe-discharge time.",
  },
  {
    title: "Get a priced quote",
    body: "Parts, labour and margin by the shop's own rules, as a PDF in your inbox. Accept, pay, and follow the build to delivery.",
  },
];

export default async function LandingPage() {
  const shops = await listPublicShops();
  return (
    <div>
      <header className="bg-ink-900 text-white">
        <div className="mx-auto flex max-w-6xl items-center justify-between px-4 py-4">
          <Logo />
          <nav className="flex items-center gap-4 text-sm">
            <Link href="/sign-in" className="hover:underline">
              Sign in
            </Link>
            <Link href="/open-shop" className={buttonClass("primary")}>
              Open a shop
            </Link>
          </nav>
        </div>
        <div className="mx-auto max-w-6xl px-4 pb-16 pt-10">
          <h1 className="max-w-3xl text-4xl font-semibold tracking-tight sm:text-5xl">Capacitor banks, designed from your stock and quoted in minutes.</h1>
          <p className="mt-4 max-w-2xl text-lg text-ink-200">
            Faradsmith is for shops that build custom supercapacitor modules, electrolytic DC-link banks and film pulse banks — and for the people who buy them.
            Customers describe the job; the engine works out which cells to put in series and in parallel, sizes the balancing and bleeder resistors, checks
            every cell&apos;s worst-case stress, and prices the build by the shop&apos;s own rules.
          </p>
        </div>
      </header>

      <main id="main" className="mx-auto max-w-6xl space-y-12 px-4 py-12">
        <section aria-labelledby="how" className="grid gap-6 md:grid-cols-3">
          <h2 id="how" className="sr-only">
            How it works
          </h2>
          {steps.map((s, i) => (
            <div key={s.title} className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-100">
              <p className="text-sm font-semibold text-copper-600">Step {i + 1}</p>
              <h3 className="mt-1 font-semibold">{s.title}</h3>
              <p className="mt-2 text-sm text-ink-600">{s.body}</p>
            </div>
          ))}
        </section>

        <section aria-labelledby="shops">
          <h2 id="shops" className="text-2xl font-semibold">
            Shops on Faradsmith
          </h2>
          <p className="mt-1 text-sm text-ink-600">Visit a storefront to explore arrangements — no account needed until you ask for a quote.</p>
          {shops.length === 0 ? (
            <p className="mt-4 text-sm text-ink-500">No shops yet. Open the first one.</p>
          ) : (
            <ul className="mt-4 grid gap-4 sm:grid-cols-2">
              {shops.map((s) => (
                <li key={s.slug} className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-100">
                  <h3 className="text-lg font-semibold">
                    <Link href={`/s/${s.slug}`} className="hover:underline">
                      {s.name}
                    </Link>
                  </h3>
                  {s.tagline ? <p className="mt-1 text-sm text-ink-600">{s.tagline}</p> : null}
                  <p className="mt-3 flex gap-4 text-sm">
                    <Link href={`/s/${s.slug}`} className="font-medium text-copper-700 hover:underline">
                      Storefront
                    </Link>
                    <Link href={`/desk/${s.slug}`} className="text-ink-600 hover:underline">
                      Staff desk
                    </Link>
                  </p>
                </li>
              ))}
            </ul>
          )}
        </section>

        <section className="rounded-lg bg-hazard-100 p-5 text-sm text-hazard-700">
          <h2 className="font-semibold">A word on safety</h2>
          <p className="mt-1">
            A charged capacitor bank keeps its energy after the supply is gone and can cause shock, burns and arcs. Figures shown here are engineering
            estimates; local electrical codes and licensed practice decide how a bank is built, installed and handled.
          </p>
        </section>
      </main>
      <footer className="border-t border-ink-200 py-6 text-center text-xs text-ink-500">Faradsmith — capacitor-bank design and quoting for shops.</footer>
    </div>
  );
}
