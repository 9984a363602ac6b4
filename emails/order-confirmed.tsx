import { Text } from "@react-email/components";
import { OrderFrame, paragraph } from "./order-frame";

export interface OrderConfirmedEmailProps {
  shopName: string;
  orderNumber: string;
  quoteNumber: string;
  /** what was received, formatted in the shop's currency */
  paid: string;
  /** what the quote comes to, formatted */
  total: string;
  /** formatted, e.g. "14 August 2026" */
  dueDate: string;
  quantity: number;
  orderUrl: string;
}

/** "Order confirmed": the payment service has confirmed the payment and the order exists. */
export function OrderConfirmedEmail(p: OrderConfirmedEmailProps) {
  const banks = `${p.quantity} ${p.quantity === 1 ? "bank" : "banks"}`;
  return (
    <OrderFrame
      shopName={p.shopName}
      preview={`${p.shopName}: order ${p.orderNumber} confirmed, ${p.paid} received, due ${p.dueDate}`}
      heading={`Order ${p.orderNumber} confirmed`}
      facts={[
        { label: "Order", value: p.orderNumber },
        { label: "Quote", value: p.quoteNumber },
        { label: "Banks", value: banks },
        { label: "Received", value: p.paid },
        { label: "Quote total", value: p.total },
        { label: "Due", value: p.dueDate },
      ]}
      orderUrl={p.orderUrl}
    >
      <Text style={paragraph}>
        Thank you: your payment has arrived and {p.shopName} has started your order. You will hear from us when the{" "}
        {p.quantity === 1 ? "bank has" : "banks have"} passed their tests, when the order ships and when it is delivered.
      </Text>
    </OrderFrame>
  );
}

export const orderConfirmedSubject = (p: { orderNumber: string; quoteNumber: string }) =>
  `Order ${p.orderNumber} confirmed: payment received for quote ${p.quoteNumber}`;

export default OrderConfirmedEmail;
