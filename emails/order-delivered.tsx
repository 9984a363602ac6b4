import { Text } from "@react-email/components";
import { OrderFrame, paragraph } from "./order-frame";

export interface OrderDeliveredEmailProps {
  shopName: string;
  orderNumber: string;
  quoteNumber: string;
  certificateUrl: string;
  orderUrl: string;
}

/** "Delivered": the carrier has delivered the order. */
export function OrderDeliveredEmail(p: OrderDeliveredEmailProps) {
  return (
    <OrderFrame
      shopName={p.shopName}
      preview={`${p.shopName}: order ${p.orderNumber} was delivered`}
      heading={`Order ${p.orderNumber} was delivered`}
      facts={[
        { label: "Order", value: p.orderNumber },
        { label: "Quote", value: p.quoteNumber },
      ]}
      orderUrl={p.orderUrl}
    >
      <Text style={paragraph}>
        Your order has been delivered. Before installing the bank, read its test certificate ({p.certificateUrl}); a charged bank keeps its energy, so treat it
        as charged until you have measured it.
      </Text>
    </OrderFrame>
  );
}

export const orderDeliveredSubject = (p: { orderNumber: string }) => `Order ${p.orderNumber} was delivered`;

export default OrderDeliveredEmail;
