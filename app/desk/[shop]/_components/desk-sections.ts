import type { Permission } from "@/lib/auth/permissions";

/** The desk's sections, each with the permission its page requires (the nav shows only those the role has). */
export const DESK_SECTIONS: { path: string; label: string; permission: Permission; summary: string }[] = [
  { path: "", label: "Today", permission: "desk:enter", summary: "What needs attention in the shop today." },
  {
    path: "requests",
    label: "Requests",
    permission: "request:read-all",
    summary: "Customers' bank requests, with those the engine could not auto-quote marked for review.",
  },
  { path: "quotes", label: "Quotes", permission: "quote:read-all", summary: "Every quote and its numbered revisions." },
  { path: "catalog", label: "Catalog", permission: "catalog:read", summary: "Cells and parts the shop builds from." },
  { path: "pricing", label: "Pricing rules", permission: "pricing:read", summary: "Labour, overhead, margin, quantity breaks and tax." },
  { path: "orders", label: "Orders", permission: "order:read-all", summary: "Paid orders through kitting, assembly, test and shipping." },
  { path: "dashboard", label: "Dashboard", permission: "reports:read", summary: "Quotes, conversion, revenue by month, orders per stage and late orders." },
  { path: "team", label: "Team", permission: "team:read", summary: "The shop's members and their roles." },
  { path: "outbox", label: "Outbox", permission: "outbox:read", summary: "E-mail sent, waiting and failed." },
  { path: "audit", label: "Audit log", permission: "audit:read", summary: "Who changed what in the shop, and when." },
  {
    path: "webhooks",
    label: "Webhooks",
    permission: "webhook:manage",
    summary: "Signed messages to the shop's own systems when quotes, orders and payments change.",
  },
  { path: "settings", label: "Settings", permission: "settings:write", summary: "Design factors, auto-quote limits and storefront text." },
  {
    path: "api-keys",
    label: "API keys",
    permission: "apikey:manage",
    summary: "Keys the shop's own systems use to read and change the catalog, prices and quotes.",
  },
];

export function sectionFor(path: string) {
  const s = DESK_SECTIONS.find((x) => x.path === path);
  if (!s) throw new Error(`unknown desk section ${path}`);
  return s;
}
