import { SectionPlaceholder } from "../_components/section-placeholder";

export default async function Page({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return (
    <SectionPlaceholder shop={shop} path="orders">
      <p>
        Paid orders moving through kitting, assembly, test, ready, shipped and delivered, with travelers, measured capacitance and ESR against the
        specification, and the customer's e-mails at each step.
      </p>
    </SectionPlaceholder>
  );
}
