import Link from "next/link";

export function Logo({ href = "/", subtitle }: { href?: string; subtitle?: string }) {
  return (
    <Link href={href} className="flex items-center gap-2">
      <img src="/logo-mark.svg" alt="" width={32} height={32} className="h-8 w-8" />
      <span className="flex flex-col leading-tight">
        <span className="text-lg font-semibold tracking-tight text-inherit">Faradsmith</span>
        {subtitle ? <span className="text-xs opacity-75">{subtitle}</span> : null}
      </span>
    </Link>
  );
}
