import "server-only";
import { listLatestTests, type OrderDetail } from "@/db/queries/orders";
import { getShopSettings } from "@/db/queries/shops";
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank/types";
import { certificateDocument, travelerDocument, type OrderFacts } from "./order-document";
import { renderCertificatePdf, renderTravelerPdf } from "./order-pdf";
import { banksNotPassed } from "./test-limits";

/** The worded facts of an order as its documents need them. */
export async function orderFacts(detail: OrderDetail): Promise<OrderFacts> {
  const settings = await getShopSettings(detail.order.shopId);
  return {
    shopName: detail.shopName,
    orderNumber: detail.order.number,
    quoteNumber: detail.quoteNumber,
    revision: detail.revision,
    customerName: detail.customerName,
    customerEmail: detail.customerEmail,
    quantity: detail.order.quantity,
    dueDate: detail.order.dueDate,
    requirement: detail.requirement,
    arrangement: detail.arrangement,
    cell: detail.cell,
    safeVoltage: (settings?.designFactors ?? DEFAULT_DESIGN_FACTORS).safeVoltage,
  };
}

/** The build traveler of an order (`O-2026-0001-traveler.pdf`). */
export async function loadTravelerPdf(detail: OrderDetail): Promise<{ buffer: Buffer; fileName: string }> {
  const buffer = await renderTravelerPdf(travelerDocument(await orderFacts(detail)), detail.shopName);
  return { buffer, fileName: `${detail.order.number}-traveler.pdf` };
}

/**
 * The test certificate (`O-2026-0001-certificate.pdf`): only once every bank's latest test has
 * passed; otherwise the reason it is not issued yet.
 */
export async function loadCertificatePdf(
  detail: OrderDetail,
  now = new Date(),
): Promise<{ ok: true; buffer: Buffer; fileName: string } | { ok: false; reason: string }> {
  const tests = await listLatestTests(detail.order.shopId, detail.order.id);
  const { missing, failed } = banksNotPassed(detail.order.quantity, tests);
  if (missing.length > 0 || failed.length > 0) return { ok: false, reason: "The test certificate is issued once every bank of the order has passed its test." };
  const doc = certificateDocument(await orderFacts(detail), tests, now.toISOString().slice(0, 10));
  return { ok: true, buffer: await renderCertificatePdf(doc, detail.shopName), fileName: `${detail.order.number}-certificate.pdf` };
}
