import { SectionPlaceholder } from "../_components/section-placeholder";

export default async function Page({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return (
    <SectionPlaceholder shop={shop} path="requests">
      <p>A sortable, filterable list of bank requests: the customer, the requirement in brief, the options the engine found, and a &ldquo;needs review&rdquo; mark for requests beyond the auto-quote limits. Estimators open one to adjust the arrangement and issue a quote.</p>
    </SectionPlaceholder>
  );
}
