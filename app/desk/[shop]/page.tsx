import Link from "next/link";
import { requireShopPage } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/vocabulary";
import { DESK_SECTIONS } from "./_components/desk-sections";

export default async function DeskTodayPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "desk:enter");
  const sections = DESK_SECTIONS.filter((s) => s.path && can(ctx.role, s.permission));
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-2xl font-semibold">Today at {ctx.shop.name}</h1>
        <p className="mt-1 text-sm text-ink-600">
          Signed in as {ctx.user.name} ({ROLE_LABELS[ctx.role].toLowerCase()}). Requests waiting for review, quotes about to lapse and orders due to ship will
          gather here.
        </p>
      </div>
      <ul className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
        {sections.map((s) => (
          <li key={s.path} className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
            <Link href={`/desk/${shop}/${s.path}`} className="font-semibold hover:underline">
              {s.label}
            </Link>
            <p className="mt-1 text-sm text-ink-600">{s.summary}</p>
          </li>
        ))}
      </ul>
    </div>
  );
}
