// The local Stripe stand-in's hosted payment page in Chromium: a payer is declined, then pays,
// and lands on success_url; another cancels back to cancel_url. Accessibility checked with
// axe-core (@axe-core/playwright) in both states of the form. Uses the stand-in `npm test`
// started (STRIPE_API_BASE) through the pinned SDK, as the app will.
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import Stripe from "stripe";
import { env } from "../../lib/env";

const stripe = new Stripe(env.STRIPE_SECRET_KEY, { ...env.STRIPE_API });

function session(baseURL: string) {
  return stripe.checkout.sessions.create({
    mode: "payment",
    success_url: `${baseURL}/?paid={CHECKOUT_SESSION_ID}`,
    cancel_url: `${baseURL}/?back=quote`,
    customer_email: "renske.haddow@tollmere-tramways.example",
    line_items: [
      { quantity: 2, price_data: { currency: "eur", unit_amount: 12345, product_data: { name: "48 V supercapacitor module" } } },
      { quantity: 1, price_data: { currency: "eur", unit_amount: 500, product_data: { name: "Shorting link for shipping" } } },
    ],
  });
}

async function expectNoAxeViolations(page: Page) {
  const results = await new AxeBuilder({ page }).analyze();
  expect(results.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`)).toEqual([]);
}

test("a payer is declined with one test card, pays with the other and lands on success_url", async ({ page, baseURL }) => {
  const s = await session(baseURL as string);
  await page.goto(s.url as string);
  await expect(page.getByRole("heading", { name: "Pay €251.90" })).toBeVisible();
  await expect(page.getByRole("table")).toContainText("48 V supercapacitor module");
  await expect(page.getByRole("table")).toContainText("€246.90");
  await expect(page.getByLabel("E-mail for the receipt")).toHaveValue("renske.haddow@tollmere-tramways.example");
  await expectNoAxeViolations(page);

  await page.getByLabel("Name on the card").fill("Renske Haddow");
  await page.getByRole("button", { name: "Pay with the declining test card" }).click();
  await expect(page.getByRole("alert")).toContainText("declined");
  await expect(page.getByLabel("Name on the card")).toHaveValue("Renske Haddow");
  await expectNoAxeViolations(page);
  expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe("open");

  await page.getByRole("button", { name: "Pay €251.90 with the approving test card" }).click();
  await expect(page).toHaveURL(`${baseURL}/?paid=${s.id}`);
  const done = await stripe.checkout.sessions.retrieve(s.id);
  expect(done).toMatchObject({ status: "complete", payment_status: "paid", customer_details: { name: "Renske Haddow" } });
});

test("a payer cancels back to cancel_url and the session stays open", async ({ page, baseURL }) => {
  const s = await session(baseURL as string);
  await page.goto(s.url as string);
  await page.getByRole("link", { name: "Cancel and go back" }).click();
  await expect(page).toHaveURL(`${baseURL}/?back=quote`);
  expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe("open");
});
