// The stand-in's hosted payment page over HTTP: what it shows, what paying, declining and
// cancelling do, and how it answers for sessions that can no longer be paid. Amounts are shown
// with the currency's ISO 4217 minor unit (JPY 0 digits, EUR 2, KWD 3: ISO 4217 list one).
// In a real browser: tests/e2e/stripe-standin.spec.ts.
import Stripe from "stripe";
import { describe, expect, it } from "vitest";
import type { Standin } from "@/dev/stripe-standin/server";
import { sessionParams, useTestStandin } from "./helpers";

let standin: Standin;
let stripe: Stripe;

async function page(url: string, form?: Record<string, string>) {
  const res = await fetch(url, {
    method: form ? "POST" : "GET",
    redirect: "manual",
    headers: form ? { "content-type": "application/x-www-form-urlencoded" } : {},
    body: form ? new URLSearchParams(form).toString() : undefined,
  });
  return { status: res.status, headers: res.headers, html: await res.text() };
}

function oneLine(currency: string, unitAmount: number, quantity = 1, name = "Film capacitor bank") {
  return sessionParams({ line_items: [{ quantity, price_data: { currency, unit_amount: unitAmount, product_data: { name } } }] });
}

useTestStandin((s, sdk) => {
  standin = s;
  stripe = sdk;
});

describe("the hosted payment page", () => {
  it("shows the line items, the total in the session's currency, labelled fields and both test cards", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    const p = await page(s.url as string);
    expect(p.status).toBe(200);
    expect(p.headers.get("content-type")).toBe("text/html; charset=utf-8");
    expect(p.headers.get("content-security-policy")).toContain("default-src 'none'");
    expect(p.headers.get("request-id")).toMatch(/^req_/);
    expect(p.html).toContain("48 V supercapacitor module");
    expect(p.html).toContain("Shorting link for shipping");
    expect(p.html).toContain("€123.45"); // unit price
    expect(p.html).toContain("€246.90"); // 2 × €123.45
    expect(p.html).toMatch(/data-testid="total">€251\.90</);
    expect(p.html).toContain('<label for="email">');
    expect(p.html).toContain('id="email" name="email" type="email"');
    expect(p.html).toContain('value="buyer@tollmere-tramways.example"');
    expect(p.html).toContain('<label for="name">');
    expect(p.html).toMatch(/<button[^>]*name="card" value="success"[^>]*>Pay €251\.90 with the approving test card<\/button>/);
    expect(p.html).toMatch(/<button[^>]*name="card" value="decline"/);
    expect(p.html).toContain('<a href="http://127.0.0.1:3999/quote">Cancel and go back</a>');
    expect(p.html).not.toContain('role="alert"');
  });

  it.each([
    ["JPY, no minor digits", "jpy", 1500, 2, /data-testid="total">JP¥3,000</],
    ["EUR, two minor digits", "eur", 150000, 1, /data-testid="total">€1,500\.00</],
    ["KWD, three minor digits", "kwd", 12345, 1, /data-testid="total">KWD\s12\.345</],
  ])("shows amounts in %s", async (_, currency, unit, quantity, total) => {
    const s = await stripe.checkout.sessions.create(oneLine(currency, unit, quantity));
    expect((await page(s.url as string)).html).toMatch(total);
  });

  it("escapes what the session carries", async () => {
    const s = await stripe.checkout.sessions.create(oneLine("eur", 5000, 1, '<img src=x onerror="alert(1)">'));
    const p = await page(s.url as string);
    expect(p.html).not.toContain("<img src=x");
    expect(p.html).toContain("&lt;img src=x onerror=&quot;alert(1)&quot;&gt;");
  });

  it("paying with the approving card redirects to success_url with the session id filled in", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    const p = await page(s.url as string, { card: "success", email: "renske.haddow@tollmere-tramways.example", name: "Renske Haddow" });
    expect(p.status).toBe(303);
    expect(p.headers.get("location")).toBe(`http://127.0.0.1:3999/paid?session=${s.id}`);
    const done = await stripe.checkout.sessions.retrieve(s.id);
    expect(done).toMatchObject({
      status: "complete",
      payment_status: "paid",
      customer_details: { email: "renske.haddow@tollmere-tramways.example", name: "Renske Haddow" },
    });
    expect((await stripe.events.list({ type: "checkout.session.completed" })).data).toHaveLength(1);
    // The page of a paid session says so and links back to the shop.
    const after = await page(`${standin.url}/checkout/${s.id}`);
    expect(after.status).toBe(200);
    expect(after.html).toContain("already been made");
    expect(after.html).toContain(`href="http://127.0.0.1:3999/paid?session=${s.id}"`);
  });

  it("the declining card shows an error on the page; the session stays open and nothing completes", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    const p = await page(s.url as string, { card: "decline", email: "renske.haddow@tollmere-tramways.example", name: "R. Haddow" });
    expect(p.status).toBe(402);
    expect(p.html).toMatch(/<div class="error" role="alert"[^>]*><strong>Payment not taken\.<\/strong> The declining test card was declined/);
    expect(p.html).toContain('value="R. Haddow"'); // what was typed is kept
    expect(p.html).toMatch(/name="card" value="success"/);
    expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe("open");
    const types = (await stripe.events.list()).data.map((e) => e.type);
    expect(types).not.toContain("checkout.session.completed");
  });

  it("refuses a card that is neither test card", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    const p = await page(s.url as string, { card: "4000000000000000" });
    expect(p.status).toBe(400);
    expect(p.html).toContain("Choose one of the two test cards.");
  });

  it("offers no way back when the session has no cancel_url", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams({ cancel_url: undefined }));
    expect((await page(s.url as string)).html).not.toContain("Cancel and go back");
  });

  it("answers 410 with a link back for an expired session, and 404 for an unknown one", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    const url = s.url as string;
    await stripe.checkout.sessions.expire(s.id);
    const expired = await page(url);
    expect(expired.status).toBe(410);
    expect(expired.html).toContain("has expired");
    expect(expired.html).toContain('href="http://127.0.0.1:3999/quote"');
    const post = await page(url, { card: "success" });
    expect(post.status).toBe(410);
    expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe("expired");
    expect((await page(`${standin.url}/checkout/cs_test_unknown`)).status).toBe(404);
  });
});
