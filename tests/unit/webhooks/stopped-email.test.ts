import { render } from "@react-email/render";
import { createElement } from "react";
import { describe, expect, it } from "vitest";
import { WebhookStoppedEmail, webhookStoppedSubject, type WebhookStoppedEmailProps } from "@/emails/webhook-stopped";

// Invented shop and address.
const props: WebhookStoppedEmailProps = {
  shopName: "Kestrel Bank Works",
  url: "https://erp.tollmere-tramways.example/hooks/faradsmith",
  failingSince: "11 August 2026, 09:30 UTC",
  stoppedAt: "14 August 2026, 09:31 UTC",
  lastError: "Answered 502.",
  endpointUrl: "http://127.0.0.1:3000/desk/kestrel-bank-works/webhooks/8b554029-24a7-4242-909e-1d01c183b5fa",
};

describe("webhook-stopped e-mail", () => {
  it("names the endpoint, since when it failed, the last answer, and links its page", async () => {
    const text = (await render(createElement(WebhookStoppedEmail, props), { plainText: true })).replace(/\s+/g, " ");
    expect(text).toContain(props.url);
    expect(text).toContain("since 11 August 2026, 09:30 UTC");
    expect(text).toContain("Last attempt: Answered 502.");
    expect(text).toContain(props.endpointUrl);
    const html = await render(createElement(WebhookStoppedEmail, props));
    expect(html).toContain(`href="${props.endpointUrl}"`);
    expect(webhookStoppedSubject(props)).toBe("A webhook endpoint was stopped — Kestrel Bank Works");
  });
});
