import { Text } from "@react-email/components";
import { OrderFrame, paragraph } from "./order-frame";

export interface OrderShippedEmailProps {
  shopName: string;
  orderNumber: string;
  quoteNumber: string;
  carrier: string;
  trackingReference: string;
  /** what arrives with the bank about its charge: a shorting link, or the shipping charge of hybrid cells */
  shippingNote: string;
  orderUrl: string;
}

/** "Shipped": the order left the shop with a carrier; the tracking reference goes with it. */
export function OrderShippedEmail(p: OrderShippedEmailProps) {
  return (
    <OrderFrame
      shopName={p.shopName}
      preview={`${p.shopName}: order ${p.orderNumber} shipped with ${p.carrier}, tracking ${p.trackingReference}`}
      heading={`Order ${p.orderNumber} has shipped`}
      facts={[
        { label: "Order", value: p.orderNumber },
        { label: "Quote", value: p.quoteNumber },
        { label: "Carrier", value: p.carrier },
        { label: "Tracking", value: p.trackingReference },
      ]}
      orderUrl={p.orderUrl}
    >
      <Text style={paragraph}>
        Your order is on its way with {p.carrier}. Quote the tracking reference {p.trackingReference} to the carrier to follow it. {p.shippingNote}
      </Text>
    </OrderFrame>
  );
}

export const orderShippedSubject = (p: { orderNumber: string; carrier: string }) => `Order ${p.orderNumber} has shipped with ${p.carrier}`;

export default OrderShippedEmail;
