/**
 * Placeholders shown while a page's data loads (the segment's loading.tsx): grey blocks in the shape
 * of what is coming, announced once to screen readers.
 */

function Skeleton({ className = "" }: { className?: string }) {
  return <div aria-hidden="true" className={`animate-pulse rounded-md bg-ink-100 ${className}`} />;
}

function Loading({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div role="status" aria-live="polite" className="space-y-6">
      <span className="sr-only">{label}</span>
      {children}
    </div>
  );
}

/** A page title and the sentence under it. */
function HeaderSkeleton() {
  return (
    <div className="space-y-2">
      <Skeleton className="h-7 w-48" />
      <Skeleton className="h-4 w-full max-w-xl" />
    </div>
  );
}

/** A list page: title, filter bar, a table of `rows` rows and `columns` columns, pager. */
export function ListSkeleton({ label, columns = 6, rows = 8 }: { label: string; columns?: number; rows?: number }) {
  return (
    <Loading label={label}>
      <HeaderSkeleton />
      <div className="flex flex-wrap items-end gap-3 rounded-lg bg-white p-4 ring-1 ring-ink-100">
        <Skeleton className="h-9 w-48" />
        <Skeleton className="h-9 w-36" />
        <Skeleton className="h-9 w-16" />
      </div>
      <div className="overflow-hidden rounded-lg bg-white ring-1 ring-ink-100">
        {Array.from({ length: rows + 1 }, (_, r) => (
          <div key={r} className={`flex gap-4 px-3 py-3 ${r === 0 ? "bg-ink-50" : "border-t border-ink-100"}`}>
            {Array.from({ length: columns }, (_, i) => (
              <Skeleton key={i} className="h-4 flex-1" />
            ))}
          </div>
        ))}
      </div>
      <Skeleton className="h-5 w-40" />
    </Loading>
  );
}

/** A document page (a quote): heading with a total, a notice, a drawing and panels of figures. */
export function DocumentSkeleton({ label }: { label: string }) {
  return (
    <Loading label={label}>
      <Skeleton className="h-4 w-40" />
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div className="space-y-2">
          <Skeleton className="h-4 w-32" />
          <Skeleton className="h-8 w-64" />
          <Skeleton className="h-4 w-80 max-w-full" />
        </div>
        <div className="space-y-2">
          <Skeleton className="ml-auto h-4 w-20" />
          <Skeleton className="h-9 w-40" />
        </div>
      </div>
      <Skeleton className="h-20 w-full" />
      <Skeleton className="h-56 w-full" />
      <div className="grid gap-4 md:grid-cols-2">
        {Array.from({ length: 4 }, (_, i) => (
          <Skeleton key={i} className="h-40" />
        ))}
      </div>
    </Loading>
  );
}

/** Any other page: title and a few panels. */
export function PageSkeleton({ label }: { label: string }) {
  return (
    <Loading label={label}>
      <HeaderSkeleton />
      <div className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
        {Array.from({ length: 6 }, (_, i) => (
          <Skeleton key={i} className="h-24" />
        ))}
      </div>
    </Loading>
  );
}
