/**
 * The hosted payment page at a session's `url`: the line items and the total in the session's
 * currency (exactly its minor digits), the payer's e-mail and name, and two test cards — one that
 * is approved, one that is declined — plus a way back to `cancel_url`. Plain HTML with labelled
 * fields, no script; every value from the session is escaped.
 */
import { formatMinor } from "./money";
import type { SessionRecord } from "./objects";

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c] as string);
}

const STYLE = `
  :root { color-scheme: light; --ink: #1d232a; --muted: #55606b; --line: #d5dadf; --accent: #0b5d50; --bad: #a1261b; }
  * { box-sizing: border-box; }
  body { margin: 0; font: 16px/1.5 system-ui, sans-serif; color: var(--ink); background: #f3f4f2; }
  main { max-width: 40rem; margin: 0 auto; padding: 1.5rem 1rem 3rem; }
  .note { font-size: .875rem; color: var(--muted); border-left: 4px solid var(--accent); padding: .25rem .75rem; background: #fff; }
  h1 { font-size: 1.5rem; margin: 1rem 0; }
  table { width: 100%; border-collapse: collapse; background: #fff; }
  caption { text-align: left; font-weight: 600; padding: .5rem 0; }
  th, td { padding: .5rem; border-bottom: 1px solid var(--line); text-align: left; vertical-align: top; }
  td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
  tfoot th, tfoot td { font-weight: 700; border-bottom: none; }
  form { margin-top: 1.5rem; background: #fff; padding: 1rem; border: 1px solid var(--line); }
  fieldset { border: none; margin: 0 0 1rem; padding: 0; }
  legend { font-weight: 600; margin-bottom: .5rem; }
  label { display: block; margin: .5rem 0 .25rem; }
  input { width: 100%; padding: .5rem; font: inherit; border: 1px solid #8a949d; border-radius: 4px; }
  .buttons { display: flex; flex-wrap: wrap; gap: .75rem; align-items: center; }
  button { font: inherit; padding: .6rem 1rem; border-radius: 4px; border: 2px solid var(--accent); cursor: pointer; }
  button.pay { background: var(--accent); color: #fff; }
  button.decline { background: #fff; color: var(--accent); }
  :focus-visible { outline: 3px solid #e0a100; outline-offset: 2px; }
  .error { color: var(--bad); border: 2px solid var(--bad); background: #fff; padding: .75rem; margin-top: 1rem; }
  .hint { font-size: .875rem; color: var(--muted); }
  a { color: var(--accent); }
  .each { display: none; }
  @media (max-width: 30rem) {
    th, td { padding: .5rem .3rem; }
    .unit { display: none; }
    .each { display: block; font-size: .875rem; color: var(--muted); }
  }
`;

function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>${STYLE}</style>
</head>
<body>
<main>
<p class="note">Test payment page of the local Stripe stand-in. No card is charged and no money moves.</p>
${body}
</main>
</body>
</html>`;
}

function itemsTable(s: SessionRecord, unitAmount: (priceId: string) => number): string {
  const rows = s.lineItems
    .map((li) => {
      const unit = escapeHtml(formatMinor(unitAmount(li.priceId), li.currency));
      // On narrow screens the unit-price column gives way to a line under the item's name.
      return `<tr><td>${escapeHtml(li.description)}<span class="each">${li.quantity} × ${unit}</span></td><td class="num">${li.quantity}</td><td class="num unit">${unit}</td><td class="num">${escapeHtml(formatMinor(li.amount, li.currency))}</td></tr>`;
    })
    .join("\n");
  return `<table>
<caption>What you are paying for</caption>
<thead><tr><th scope="col">Item</th><th scope="col" class="num">Quantity</th><th scope="col" class="num unit">Unit price</th><th scope="col" class="num">Amount</th></tr></thead>
<tbody>
${rows}
</tbody>
<tfoot><tr><th scope="row" colspan="2">Total (${escapeHtml(s.currency.toUpperCase())})</th><td class="unit"></td><td class="num" data-testid="total">${escapeHtml(formatMinor(s.amountTotal, s.currency))}</td></tr></tfoot>
</table>`;
}

export interface PageOptions {
  /** Shown after a declined test card. */
  error?: string;
  email?: string;
  name?: string;
}

export function checkoutPage(s: SessionRecord, unitAmount: (priceId: string) => number, opts: PageOptions = {}): string {
  const total = formatMinor(s.amountTotal, s.currency);
  const closes = new Date(s.expiresAt * 1000).toISOString().replace("T", " ").slice(0, 16);
  const email = opts.email ?? s.customerEmail ?? "";
  const error = opts.error ? `<div class="error" role="alert" id="payment-error"><strong>Payment not taken.</strong> ${escapeHtml(opts.error)}</div>` : "";
  const cancel = s.cancelUrl ? `<a href="${escapeHtml(s.cancelUrl)}">Cancel and go back</a>` : "";
  return layout(
    `Pay ${total}`,
    `<h1>Pay ${escapeHtml(total)}</h1>
${itemsTable(s, unitAmount)}
${error}
<form method="post" action="/checkout/${escapeHtml(s.id)}">
<fieldset>
<legend>Payer</legend>
<label for="email">E-mail for the receipt</label>
<input id="email" name="email" type="email" autocomplete="email" value="${escapeHtml(email)}">
<label for="name">Name on the card</label>
<input id="name" name="name" type="text" autocomplete="cc-name" value="${escapeHtml(opts.name ?? "")}">
</fieldset>
<fieldset>
<legend>Test card</legend>
<p class="hint" id="card-hint">Choose which test card to pay with: one the bank approves, one it declines.</p>
<div class="buttons">
<button class="pay" type="submit" name="card" value="success" aria-describedby="card-hint">Pay ${escapeHtml(total)} with the approving test card</button>
<button class="decline" type="submit" name="card" value="decline" aria-describedby="card-hint">Pay with the declining test card</button>
${cancel}
</div>
</fieldset>
<p class="hint">This page closes at ${closes} UTC.</p>
</form>`,
  );
}

/** For a session that can no longer be paid (with a link back to the shop), and for an unknown one. */
export function closedPage(state: "missing" | "complete" | "expired", back: string | null): string {
  const title = { missing: "Payment page not found", complete: "Already paid", expired: "Payment page expired" }[state];
  const text = {
    missing: "There is no payment with this address.",
    complete: "This payment has already been made.",
    expired: "This payment page has expired. Start the payment again from the shop.",
  }[state];
  const link = back ? `<p><a href="${escapeHtml(back)}">Return to the shop</a></p>` : "";
  return layout(title, `<h1>${title}</h1><p>${text}</p>${link}`);
}
