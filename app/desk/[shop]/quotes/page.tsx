import { SectionPlaceholder } from "../_components/section-placeholder";

export default async function Page({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return (
    <SectionPlaceholder shop={shop} path="quotes">
      <p>Every quote by number and revision (Q-2026-0001 r1…), its customer, total, validity and state, with its PDF; issuing a new revision freezes its figures and prices.</p>
    </SectionPlaceholder>
  );
}
