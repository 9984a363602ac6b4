import type { Metadata } from "next";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { getAuditFacets, listAudit, type AuditListRow } from "@/db/queries/audit";
import { requireShopPage } from "@/lib/auth/guards";
import { auditList } from "@/lib/validation/lists";

export const metadata: Metadata = { title: "Audit log" };

function when(d: Date): string {
  return `${d.toISOString().slice(0, 19).replace("T", " ")} UTC`;
}

function Actor({ row }: { row: AuditListRow }) {
  if (row.actorName) {
    return (
      <>
        <span className="block">{row.actorName}</span>
        <span className="block text-xs text-ink-600">{row.actorEmail}</span>
      </>
    );
  }
  if (row.actorKeyId) return <span className="text-ink-700">API key {row.actorKeyId}</span>;
  return <span className="text-ink-600">{row.actorUserId ? "A former member" : "The system"}</span>;
}

function shown(value: unknown): string {
  if (value === null || value === undefined || value === "") return "—";
  return typeof value === "string" ? value : JSON.stringify(value);
}

/** Field-by-field changes, folded away under the summary. */
function Changes({ changes }: { changes: AuditListRow["changes"] }) {
  const entries = Object.entries(changes ?? {});
  if (entries.length === 0) return null;
  return (
    <details className="mt-1 text-xs">
      <summary className="cursor-pointer text-ink-600">
        {entries.length} field{entries.length === 1 ? "" : "s"} changed
      </summary>
      <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5">
        {entries.map(([field, c]) => (
          <div key={field} className="contents">
            <dt className="font-medium text-ink-700">{field}</dt>
            <dd className="break-words">
              <span className="text-ink-600 line-through">{shown(c.from)}</span> → <span>{shown(c.to)}</span>
            </dd>
          </div>
        ))}
      </dl>
    </details>
  );
}

/** The manager's audit log: every staff change in the shop, who made it and when. Entries are never changed or removed. */
export default async function AuditPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "audit:read", `/desk/${shop}/audit`);
  const { query: q } = auditList.parse(await searchParams);
  const [page, facets] = await Promise.all([listAudit(ctx.shop.id, q), getAuditFacets(ctx.shop.id)]);
  const state = auditList.state(`/desk/${shop}/audit`, q, page);
  const withCurrent = (values: string[], current: string) => (current && !values.includes(current) ? [...values, current] : values);
  return (
    <div className="space-y-6">
      <PageHeader title="Audit log">
        Every change staff make in {ctx.shop.name} — roles, catalog, prices, quotes and orders — with who made it and when. The log only grows: no one, not even
        a manager, can edit or remove an entry.
      </PageHeader>
      <ListView
        state={state}
        caption="Audit entries"
        empty={{ none: "Nothing recorded yet: changes appear here as staff make them.", noMatch: "No entries match." }}
        filters={[
          { name: "q", label: "Summary or record", value: q.q },
          {
            name: "action",
            label: "Change",
            value: q.action,
            options: [{ value: "", label: "All changes" }, ...withCurrent(facets.actions, q.action).map((a) => ({ value: a, label: a }))],
          },
          {
            name: "actor",
            label: "Who",
            value: q.actor,
            options: [
              { value: "", label: "Everyone" },
              // a name alone, unless two people share it
              ...facets.actors.map((a) => ({
                value: a.id,
                label: facets.actors.filter((b) => b.name === a.name).length > 1 ? `${a.name} (${a.email})` : a.name,
              })),
              ...(q.actor && !facets.actors.some((a) => a.id === q.actor) ? [{ value: q.actor, label: "Someone else" }] : []),
            ],
          },
          {
            name: "subject",
            label: "Record",
            value: q.subject,
            options: [{ value: "", label: "All records" }, ...withCurrent(facets.subjectTypes, q.subject).map((s) => ({ value: s, label: s }))],
          },
        ]}
        columns={[
          { label: "When", sortKey: "created" },
          { label: "Who", sortKey: "actor" },
          { label: "Change", sortKey: "action" },
          { label: "Record", sortKey: "subject" },
          { label: "What changed" },
        ]}
      >
        {page.rows.map((e) => (
          <tr key={e.id} className="border-t border-ink-100 align-top" data-testid={`audit-${e.id}`}>
            <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{when(e.createdAt)}</td>
            <td className="px-3 py-2">
              <Actor row={e} />
            </td>
            <td className="whitespace-nowrap px-3 py-2 font-mono text-xs">{e.action}</td>
            <td className="px-3 py-2 text-xs">
              <span className="block">{e.subjectType}</span>
              {e.subjectId ? <span className="block whitespace-nowrap font-mono text-ink-600">{e.subjectId}</span> : null}
            </td>
            <td className="px-3 py-2">
              {e.summary}
              <Changes changes={e.changes} />
            </td>
          </tr>
        ))}
      </ListView>
    </div>
  );
}
