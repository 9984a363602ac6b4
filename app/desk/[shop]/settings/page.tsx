import { SectionPlaceholder } from "../_components/section-placeholder";

export default async function Page({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return (
    <SectionPlaceholder shop={shop} path="settings">
      <p>
        Design factors (capacitance fade, ESR growth, voltage derating, cell matching, balancing factor, resistor series, safe voltage and time), auto-quote
        limits and the storefront's text and currency.
      </p>
    </SectionPlaceholder>
  );
}
