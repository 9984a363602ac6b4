import { Text } from "@react-email/components";
import { OrderFrame, paragraph } from "./order-frame";

export interface OrderReadyEmailProps {
  shopName: string;
  orderNumber: string;
  quoteNumber: string;
  quantity: number;
  /** the test certificate's address */
  certificateUrl: string;
  orderUrl: string;
}

/** "Ready to ship": every bank has passed its acceptance test; the certificate is on the order page. */
export function OrderReadyEmail(p: OrderReadyEmailProps) {
  return (
    <OrderFrame
      shopName={p.shopName}
      preview={`${p.shopName}: order ${p.orderNumber} passed its tests and is ready to ship`}
      heading={`Order ${p.orderNumber} is ready to ship`}
      facts={[
        { label: "Order", value: p.orderNumber },
        { label: "Quote", value: p.quoteNumber },
        { label: "Banks", value: String(p.quantity) },
      ]}
      orderUrl={p.orderUrl}
    >
      <Text style={paragraph}>
        {p.quantity === 1 ? "Your bank has" : `All ${p.quantity} banks have`} passed the acceptance test: capacitance, ESR, leakage after a hold and the balance
        of every series position, each against the limits of your quote. The test certificate is on your order page:{" "}
        <a href={p.certificateUrl}>{p.certificateUrl}</a>
      </Text>
    </OrderFrame>
  );
}

export const orderReadySubject = (p: { orderNumber: string }) => `Order ${p.orderNumber} has passed its tests and is ready to ship`;

export default OrderReadyEmail;
