import type { Metadata } from "next";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { listApiKeys } from "@/db/queries/api-keys";
import { requireShopPage } from "@/lib/auth/guards";
import { apiKeyList } from "@/lib/validation/lists";
import { NewKeyForm } from "./_components/new-key-form";
import { RevokeButton } from "./_components/revoke-button";

export const metadata: Metadata = { title: "API keys" };

const when = (d: Date | null) => (d ? d.toISOString().slice(0, 16).replace("T", " ") : "never");

/** The shop's API keys: make one (its secret shown once), see when each was last used, revoke. */
export default async function ApiKeysPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "apikey:manage", `/desk/${shop}/api-keys`);
  const { query: q } = apiKeyList.parse(await searchParams);
  const page = await listApiKeys(ctx.shop.id, q);
  const state = apiKeyList.state(`/desk/${shop}/api-keys`, q, page);
  return (
    <div className="space-y-6">
      <PageHeader title="API keys">
        Keys let the shop&apos;s own systems read and change the catalog, the pricing rules and quotes through the API, within the scopes they are given. Each
        key has its own rate limit, every call made with it is in the audit log, and a revoked key stops working at once.
      </PageHeader>
      <NewKeyForm shop={shop} />
      <ListView
        state={state}
        caption="API keys"
        empty={{ none: "No keys yet.", noMatch: "No keys match." }}
        filters={[
          { name: "q", label: "Name or prefix", value: q.q },
          {
            name: "status",
            label: "Status",
            value: q.status,
            options: [
              { value: "all", label: "All" },
              { value: "live", label: "Live" },
              { value: "revoked", label: "Revoked" },
            ],
          },
        ]}
        columns={[
          { label: "Name", sortKey: "name" },
          { label: "Scopes" },
          { label: "Made", sortKey: "created" },
          { label: "Last used (UTC)", sortKey: "used" },
          { label: "Status", sortKey: "status" },
        ]}
      >
        {page.rows.map((k) => (
          <tr key={k.id} className={`border-t border-ink-100 align-top ${k.revokedAt ? "text-ink-500" : ""}`}>
            <td className="px-3 py-2">
              {k.name}
              <span className="block font-mono text-xs text-ink-500">{k.prefix}…</span>
            </td>
            <td className="px-3 py-2 font-mono text-xs">{k.scopes.join(", ")}</td>
            <td className="whitespace-nowrap px-3 py-2">
              {when(k.createdAt)}
              <span className="block text-xs text-ink-500">{k.createdByName ?? "—"}</span>
            </td>
            <td className="whitespace-nowrap px-3 py-2" data-testid="key-last-used">
              {when(k.lastUsedAt)}
            </td>
            <td className="px-3 py-2">{k.revokedAt ? `Revoked ${when(k.revokedAt)}` : <RevokeButton shop={shop} id={k.id} name={k.name} />}</td>
          </tr>
        ))}
      </ListView>
    </div>
  );
}
