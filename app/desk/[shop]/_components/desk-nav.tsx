"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";

export function DeskNav({ slug, items }: { slug: string; items: { path: string; label: string }[] }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Desk" className="flex gap-1 overflow-x-auto md:flex-col">
      {items.map((item) => {
        const href = item.path ? `/desk/${slug}/${item.path}` : `/desk/${slug}`;
        const active = pathname === href;
        return (
          <Link
            key={item.path}
            href={href}
            aria-current={active ? "page" : undefined}
            className={`whitespace-nowrap rounded-md px-3 py-2 text-sm ${active ? "bg-ink-800 font-medium text-white" : "text-ink-200 hover:bg-ink-800/60 hover:text-white"}`}
          >
            {item.label}
          </Link>
        );
      })}
    </nav>
  );
}
