import type { Metadata } from "next";
import Link from "next/link";
import { countOrdersByStatus } from "@/db/queries/orders";
import { countTodayWork } from "@/db/queries/today";
import { requireShopPage } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { ORDER_STATUS_LABELS, ROLE_LABELS, type OrderStatus } from "@/lib/vocabulary";
import { DESK_SECTIONS } from "./_components/desk-sections";

export const metadata: Metadata = { title: "Today" };

/** Quotes lapsing within this many days are listed as needing a word with the customer. */
const EXPIRING_WITHIN_DAYS = 7;
/** Orders still in the shop's hands, in the order they move. */
const OPEN_STAGES: OrderStatus[] = ["paid", "kitting", "assembling", "testing", "ready", "on-hold"];

function Count({ href, n, label, testId }: { href: string; n: number; label: string; testId: string }) {
  return (
    <li>
      <Link href={href} className="block rounded-lg bg-white px-4 py-3 ring-1 ring-ink-100 hover:ring-copper-600" data-testid={testId}>
        <span className={`num block text-2xl font-semibold ${n > 0 ? "text-ink-900" : "text-ink-500"}`}>{n}</span>
        <span className="text-sm text-ink-700">{label}</span>
      </Link>
    </li>
  );
}

/** The desk's first page: what needs doing today, each count linking to the list it counts; then every section. */
export default async function DeskTodayPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "desk:enter");
  const sections = DESK_SECTIONS.filter((s) => s.path && can(ctx.role, s.permission));
  const today = new Date().toISOString().slice(0, 10);
  const seesOrders = can(ctx.role, "order:read-all");
  const [work, orders] = await Promise.all([
    countTodayWork(ctx.shop.id, today, EXPIRING_WITHIN_DAYS),
    seesOrders ? countOrdersByStatus(ctx.shop.id) : Promise.resolve(null),
  ]);
  const base = `/desk/${shop}`;
  return (
    <div className="space-y-8">
      <div>
        <h1 className="text-2xl font-semibold">Today at {ctx.shop.name}</h1>
        <p className="mt-1 text-sm text-ink-600">
          Signed in as {ctx.user.name} ({ROLE_LABELS[ctx.role].toLowerCase()}).
        </p>
      </div>
      <section aria-labelledby="to-do" className="space-y-3">
        <h2 id="to-do" className="text-sm font-semibold uppercase tracking-wide text-ink-600">
          Needs doing
        </h2>
        <ul className="grid gap-3 sm:grid-cols-2 xl:grid-cols-4">
          {can(ctx.role, "request:read-all") ? (
            <Count href={`${base}/requests?status=needs-review`} n={work.needsReview} label="requests awaiting review" testId="today-needs-review" />
          ) : null}
          {can(ctx.role, "quote:read-all") ? (
            <Count
              href={`${base}/quotes?status=sent&sort=validUntil&dir=asc`}
              n={work.expiringQuotes}
              label={`quotes lapsing within ${EXPIRING_WITHIN_DAYS} days`}
              testId="today-expiring"
            />
          ) : null}
        </ul>
        {orders ? (
          <>
            <h3 className="pt-2 text-sm font-medium text-ink-700">Orders in the workshop, by stage</h3>
            <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 xl:grid-cols-6">
              {OPEN_STAGES.map((s) => (
                <Count
                  key={s}
                  href={`${base}/orders/list?status=${s}`}
                  n={orders[s]}
                  label={ORDER_STATUS_LABELS[s].toLowerCase()}
                  testId={`today-orders-${s}`}
                />
              ))}
            </ul>
          </>
        ) : null}
      </section>
      <section aria-labelledby="sections" className="space-y-3">
        <h2 id="sections" className="text-sm font-semibold uppercase tracking-wide text-ink-600">
          Sections
        </h2>
        <ul className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
          {sections.map((s) => (
            <li key={s.path} className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
              <Link href={`${base}/${s.path}`} className="font-semibold hover:underline">
                {s.label}
              </Link>
              <p className="mt-1 text-sm text-ink-600">{s.summary}</p>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
