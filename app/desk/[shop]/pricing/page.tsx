import type { Metadata } from "next";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { getRulesInForce, listRuleVersions } from "@/db/queries/pricing-rules";
import { requireShopPage } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { diffRules } from "@/lib/pricing/rule-versions";
import { ruleVersionList } from "@/lib/validation/lists";
import { formFromRules } from "@/lib/validation/pricing";
import { RulesForm } from "./_components/rules-form";

export const metadata: Metadata = { title: "Pricing rules" };

/** The shop's pricing rules: the form with its preview, and every saved version with who, when, why and what changed. */
export default async function PricingPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "pricing:read", `/desk/${shop}/pricing`);
  const { query: q } = ruleVersionList.parse(await searchParams);
  const [inForce, history] = await Promise.all([getRulesInForce(ctx.shop.id), listRuleVersions(ctx.shop.id, q)]);
  const state = ruleVersionList.state(`/desk/${shop}/pricing`, q, history);
  return (
    <div className="space-y-6">
      <PageHeader title="Pricing rules">
        How the shop turns parts and hours into a price. Each save is a new version with its reason; quotes already issued keep the prices they were issued
        with, and only quotes made from then on use the new rules.
        {inForce.version > 0 ? ` In force: version ${inForce.version}.` : " These are the rules the shop opened with."}
      </PageHeader>
      <RulesForm shop={shop} initial={formFromRules(inForce.rules)} version={inForce.version} canWrite={can(ctx.role, "pricing:write")} />
      <section className="space-y-3" aria-labelledby="history-title">
        <h2 id="history-title" className="text-lg font-semibold">
          History
        </h2>
        <ListView
          state={state}
          caption="Pricing rule versions"
          empty={{ none: "No change saved yet: the rules are those the shop opened with.", noMatch: "No versions." }}
          filters={[]}
          columns={[{ label: "Version", sortKey: "version" }, { label: "Saved" }, { label: "Why" }, { label: "What changed" }]}
        >
          {history.rows.map((v) => {
            const changes = v.previous ? diffRules(v.previous, v.rules) : [];
            return (
              <tr key={v.version} className="border-t border-ink-100 align-top">
                <td className="num px-3 py-2">{v.version}</td>
                <td className="whitespace-nowrap px-3 py-2">
                  {v.createdAt.toISOString().slice(0, 16).replace("T", " ")}
                  <span className="block text-xs text-ink-500">{v.savedByName ?? (v.savedByKeyId ? "API key" : "—")}</span>
                </td>
                <td className="px-3 py-2">{v.reason}</td>
                <td className="px-3 py-2">
                  {v.previous === null ? (
                    <span className="text-ink-500">The rules as they were before</span>
                  ) : changes.length === 0 ? (
                    <span className="text-ink-500">Saved unchanged</span>
                  ) : (
                    <ul className="space-y-0.5">
                      {changes.map((c) => (
                        <li key={c.key}>
                          <span className="font-medium">{c.label}</span>: {c.from} → {c.to}
                        </li>
                      ))}
                    </ul>
                  )}
                </td>
              </tr>
            );
          })}
        </ListView>
      </section>
    </div>
  );
}
