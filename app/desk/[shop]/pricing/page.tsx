import { SectionPlaceholder } from "../_components/section-placeholder";

export default async function Page({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return (
    <SectionPlaceholder shop={shop} path="pricing">
      <p>
        The shop's pricing rules: labour rate and minutes, overhead, margin on price, quantity breaks, tax and the enclosure and terminal costs — each change
        previewed on a sample bank before it is saved.
      </p>
    </SectionPlaceholder>
  );
}
