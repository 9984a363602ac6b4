import "server-only";
import { randomUUID } from "node:crypto";
import { render } from "@react-email/render";
import { createElement } from "react";
import { getShopIdentity } from "@/db/queries/shops";
import { insertOutboxMessage } from "@/db/queries/outbox";
import type { EmailOutboxRow } from "@/db/schema";
import { withShop } from "@/db/tx";
import { AccountExistsEmail, accountExistsSubject, type AccountExistsEmailProps } from "@/emails/account-exists";
import { accountKey } from "@/db/queries/sign-in-failures";
import { mailSettings } from "./config";
import { outboxMessageId, senderDomain } from "./format";
import { dispatchOutbox } from "./outbox";
import { sendMessage, type OutgoingMessage } from "./transport";

export const ACCOUNT_EXISTS_KIND = "account-exists";

const signInUrl = (appUrl: string, next: string, shopSlug?: string) =>
  `${appUrl.replace(/\/+$/, "")}/sign-in?${new URLSearchParams({ ...(shopSlug ? { shop: shopSlug } : {}), next }).toString()}`;

async function renderNotice(props: AccountExistsEmailProps) {
  const email = createElement(AccountExistsEmail, props);
  const [html, text] = await Promise.all([render(email), render(email, { plainText: true })]);
  return { html, text, subject: accountExistsSubject(props) };
}

/**
 * Someone filled in a shop's join form with an e-mail that has an account: the notice goes out
 * through the shop's outbox like its other mail (retries, one Message-ID). At most one a day per
 * shop and address (the dedupe key), so the form cannot be used to flood someone's inbox.
 */
export async function enqueueAccountExists({ shopId, shopName, email }: { shopId: string; shopName: string; email: string }): Promise<void> {
  const day = new Date().toISOString().slice(0, 10);
  await withShop(shopId, (tx) =>
    insertOutboxMessage(tx, shopId, {
      kind: ACCOUNT_EXISTS_KIND,
      dedupeKey: `${ACCOUNT_EXISTS_KIND}:${accountKey(email)}:${day}`,
      toEmail: email,
      subject: accountExistsSubject({ attempt: { kind: "join", shopName } }),
      quoteRevisionId: null,
    }),
  );
  await dispatchOutbox();
}

/** The message an "account-exists" outbox row stands for. */
export async function buildAccountExistsMessage(row: EmailOutboxRow): Promise<OutgoingMessage> {
  const shop = await getShopIdentity(row.shopId);
  if (!shop) throw new Error("the shop of this message no longer exists");
  const settings = mailSettings();
  const { html, text } = await renderNotice({
    email: row.toEmail,
    attempt: { kind: "join", shopName: shop.name },
    signInUrl: signInUrl(settings.appUrl, `/s/${shop.slug}/join`, shop.slug),
  });
  return { to: row.toEmail, subject: row.subject, html, text, messageId: outboxMessageId(row.id, settings.from) };
}

/**
 * The same notice for the open-a-shop form. No shop exists there, and the outbox belongs to a
 * shop, so this one is handed to the mail server directly, once, after the answer has gone out;
 * a failure is logged. (The page answers the same either way; see app/(auth)/open-shop/actions.ts.)
 */
export function sendOpenShopNotice({ email, shopName }: { email: string; shopName: string }): void {
  void (async () => {
    const settings = mailSettings();
    const { html, text, subject } = await renderNotice({ email, attempt: { kind: "open-shop", shopName }, signInUrl: signInUrl(settings.appUrl, "/my-shops") });
    await sendMessage({ to: email, subject, html, text, messageId: `<account-${randomUUID()}@${senderDomain(settings.from)}>` });
  })().catch((error) =>
    console.error(`[mail] the account notice for an open-shop attempt was not sent: ${error instanceof Error ? error.message : String(error)}`),
  );
}
