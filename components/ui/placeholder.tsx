/** A page section that a later part of the product fills: says plainly what will be here. */
export function Placeholder({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="rounded-lg border border-dashed border-ink-300 bg-white p-6">
      <h2 className="text-base font-semibold text-ink-800">{title}</h2>
      <div className="mt-2 space-y-2 text-sm text-ink-600">{children}</div>
    </section>
  );
}
