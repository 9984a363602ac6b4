import { Button, Heading, Hr, Text } from "@react-email/components";
import { EmailFrame } from "./email-frame";
import { COPPER, INK_100, INK_600, INK_900 } from "./theme";

export interface WebhookStoppedEmailProps {
  shopName: string;
  /** the endpoint's address */
  url: string;
  /** when its attempts started failing, and when it was stopped, as people read them */
  failingSince: string;
  stoppedAt: string;
  /** the last attempt's outcome in a sentence, e.g. "Answered 500." */
  lastError: string;
  /** the endpoint's page on the desk */
  endpointUrl: string;
}

export const webhookStoppedSubject = (p: Pick<WebhookStoppedEmailProps, "shopName">) => `A webhook endpoint was stopped — ${p.shopName}`;

/**
 * "A webhook endpoint was stopped": to the shop's managers when an endpoint's every attempt has
 * failed for days. Says which endpoint, since when, what the last attempt got, and what to do.
 */
export function WebhookStoppedEmail({ shopName, url, failingSince, stoppedAt, lastError, endpointUrl }: WebhookStoppedEmailProps) {
  return (
    <EmailFrame preview={`${url} has not accepted a delivery since ${failingSince}; Faradsmith stopped sending to it.`}>
      <Heading as="h1" style={{ fontSize: 22, lineHeight: "30px", margin: "0 0 16px" }}>
        A webhook endpoint was stopped
      </Heading>
      <Text style={para}>
        Every delivery from {shopName} to <strong>{url}</strong> has failed since {failingSince}. On {stoppedAt} Faradsmith stopped sending to it, so your
        system no longer hears of quotes, orders, refunds or catalog imports through it.
      </Text>
      <Text style={para}>Last attempt: {lastError}</Text>
      <Text style={para}>
        Once the receiving system answers again, start the endpoint from its page and send the missed events again from its delivery log.
      </Text>
      <Button
        href={endpointUrl}
        style={{ backgroundColor: INK_900, borderRadius: 4, color: "#ffffff", fontSize: 15, fontWeight: 600, margin: "8px 0 16px", padding: "12px 20px" }}
      >
        Open the endpoint
      </Button>
      <Text style={{ color: INK_600, fontSize: 13, lineHeight: "20px", margin: "0 0 8px" }}>
        Or open this address:{" "}
        <a href={endpointUrl} style={{ color: COPPER }}>
          {endpointUrl}
        </a>
      </Text>
      <Hr style={{ borderColor: INK_100, margin: "20px 0" }} />
      <Text style={{ color: INK_600, fontSize: 12, lineHeight: "18px", margin: 0 }}>You receive this because you are a manager of {shopName}.</Text>
    </EmailFrame>
  );
}

const para = { fontSize: 15, lineHeight: "22px", margin: "0 0 14px" } as const;

export default WebhookStoppedEmail;
