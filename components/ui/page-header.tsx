/** A page's title and the sentence under it that says what the page holds. */
export function PageHeader({ title, children }: { title: React.ReactNode; children?: React.ReactNode }) {
  return (
    <div>
      <h1 className="text-2xl font-semibold">{title}</h1>
      {children ? <p className="mt-1 max-w-3xl text-sm text-ink-600">{children}</p> : null}
    </div>
  );
}
