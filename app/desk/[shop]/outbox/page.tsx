import { SectionPlaceholder } from "../_components/section-placeholder";

export default async function Page({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return (
    <SectionPlaceholder shop={shop} path="outbox">
      <p>Every e-mail the shop sends — quotes, receipts, status changes — with its state: sent, waiting to retry, or failed with the reason.</p>
    </SectionPlaceholder>
  );
}
