// Accept and pay, then the build: a new customer of Kestrel chooses a bank and pays on the Stripe
// stand-in's hosted page; the success page waits for the webhook; the manager moves the order
// through every stage, entering test results (a failing test first); the customer follows the
// timeline, downloads the test certificate and finds each e-mail in the mail stand-in (maildev's
// REST API, GET /api/email).
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Page } from "@playwright/test";
import { expectNoSeriousA11y } from "./a11y";
import { expect, test } from "./fixtures";
import { signIn, unique } from "./helpers";

const K = "kestrel-bank-works";
const KESTREL_MANAGER = "ottilie.brandvold@kestrel-bank-works.example";
const INBOX = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:1080";

interface InboxMail {
  subject: string;
  text?: string;
  to: { address: string }[];
}

async function mailsTo(address: string): Promise<InboxMail[]> {
  const res = await fetch(`${INBOX}/api/email`);
  return res.ok ? ((await res.json()) as InboxMail[]).filter((m) => m.to.some((t) => t.address === address)) : [];
}

/** Waits for an e-mail to `address` whose subject matches; the limit bounds a broken run only. */
async function waitForMail(address: string, subject: RegExp): Promise<InboxMail> {
  const until = Date.now() + 30_000;
  for (;;) {
    const found = (await mailsTo(address)).find((m) => subject.test(m.subject));
    if (found) return found;
    if (Date.now() > until) throw new Error(`no e-mail to ${address} matching ${subject}`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

/** A new customer of Kestrel signs up on the storefront and chooses a 48 V, 20 kJ bank: the quote's number and total. */
async function newCustomerQuote(page: Page, name: string, email: string, password: string) {
  await page.goto(`/s/${K}/join`);
  await page.getByLabel("Your name").fill(name);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Create my account" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${K}$`));
  await page.getByLabel("Maximum voltage").fill("48 V");
  await page.getByLabel("Minimum voltage (optional)").fill("24 V");
  await page.getByLabel("Usable energy needed").fill("20 kJ");
  await page.getByRole("button", { name: "Show arrangements" }).click();
  await page.getByTestId("focused-option").getByRole("button", { name: "Choose this arrangement" }).click();
  await page.getByTestId("choice-review").getByRole("button", { name: "Confirm and get the quote" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${K}/quotes/Q-\\d{4}-\\d{4}$`), { timeout: 30_000 });
  return { quoteNumber: (await page.getByTestId("quote-number").innerText()).trim(), total: (await page.getByTestId("quote-total").innerText()).trim() };
}

async function moveTo(page: Page, stage: string, note = "") {
  const form = page.getByRole("form", { name: "Move the order" });
  await form.getByLabel("Move to").selectOption({ label: stage });
  if (note) await form.getByLabel("Note (optional)").fill(note);
  return form;
}

test("a customer pays on the hosted page; the manager builds, tests and ships; the customer follows it to the certificate and every e-mail", async ({
  page,
  browser,
}) => {
  test.setTimeout(240_000);
  const email = `vesna.tull.${unique()}@larchmoor-rail.example`;

  // A new customer signs up and chooses a bank.
  const { quoteNumber, total } = await newCustomerQuote(page, "Vesna Tull", email, "larchmoor-depot-password");

  // Accept and pay the whole amount on the hosted page (declined once, then approved).
  const pay = page.getByTestId("pay-section");
  await expect(pay.getByText("Deposit (30 %)")).toBeVisible();
  await pay.getByLabel(/The whole amount/).check();
  await pay.getByRole("button", { name: `Accept and pay ${total}` }).click();
  await expect(page.getByRole("heading", { name: `Pay ${total}` })).toBeVisible({ timeout: 20_000 });
  await page.getByRole("button", { name: "Pay with the declining test card" }).click();
  await expect(page.getByRole("alert")).toContainText("declined");
  await page.getByRole("button", { name: new RegExp(`Pay ${total.replace(/[.$^()]/g, "\\$&")} with the approving test card`) }).click();

  // Back on the shop: the success page waits for the webhook, then names the order.
  await expect(page).toHaveURL(new RegExp(`/s/${K}/quotes/${quoteNumber}/paid\\?session=cs_`));
  await expect(page.getByTestId("payment-confirmed")).toContainText(/order O-\d{4}-\d{4} has started/, { timeout: 30_000 });
  const orderNumber = ((await page.getByTestId("payment-confirmed").innerText()).match(/O-\d{4}-\d{4}/) ?? [""])[0];
  await expectNoSeriousA11y(page, "the page after paying");
  await page.getByRole("link", { name: `Follow order ${orderNumber}` }).click();
  await expect(page.getByTestId("order-status")).toHaveText("Paid");
  await expect(page.getByTestId("order-paid")).toHaveText(total);
  await expectNoSeriousA11y(page, "the customer's order");
  await waitForMail(email, new RegExp(`Order ${orderNumber} confirmed`));

  // The manager moves it through every stage, entering test results.
  const staff = await browser.newContext();
  const desk = await staff.newPage();
  await signIn(desk, KESTREL_MANAGER);
  await desk.goto(`/desk/${K}/orders`);
  await desk.getByTestId(`card-${orderNumber}`).click();
  await expect(desk.getByTestId("order-number")).toHaveText(orderNumber);
  await expectNoSeriousA11y(desk, "the order on the desk");
  for (const [stage, note] of [
    ["Kitting", "Cells pulled from graded stock"],
    ["Assembling", ""],
    ["Testing", ""],
  ] as const) {
    const form = await moveTo(desk, stage, note);
    await form.getByRole("button", { name: `Move to ${stage.toLowerCase()}` }).click();
    await expect(desk.getByTestId("order-status")).toHaveText(stage);
  }

  // Test values read off a bank built exactly to its specification (the limits table says what that is).
  const limits = desk.getByTestId("test-limits");
  const nominal = async (name: string) => Number(await limits.getAttribute(`data-${name}`));
  const positions = await nominal("positions");
  const volts = (await nominal("position-voltage")).toFixed(4);
  const testForm = desk.getByRole("form", { name: "Record a test" });
  const fill = async (capacitance: number) => {
    await testForm.getByLabel("Capacitance").fill(`${capacitance.toPrecision(6)} F`);
    await testForm.getByLabel("ESR").fill(`${((await nominal("esr")) * 1000).toPrecision(4)} mΩ`);
    await testForm.getByLabel("Hold at the test voltage (minutes)").fill(String(await nominal("hold")));
    await testForm.getByLabel("Leakage current after the hold").fill("0 A");
    await testForm.getByLabel(/Voltage of each position/).fill(Array.from({ length: positions }, () => `${volts} V`).join("\n"));
    await testForm.getByRole("button", { name: "Record the test" }).click();
  };
  await fill((await nominal("capacitance")) * 0.5);
  await expect(testForm.getByRole("alert")).toContainText("Bank 1: failed (capacitance)");
  const ready = await moveTo(desk, "Ready to ship");
  await ready.getByRole("button", { name: "Move to ready to ship" }).click();
  await expect(ready.getByRole("alert")).toContainText("latest test of bank 1 failed");
  await fill(await nominal("capacitance"));
  await expect(testForm.getByRole("status")).toContainText("Bank 1: passed");
  await expect(desk.getByTestId("test-results")).toContainText("Bank 1: passed");
  await (await moveTo(desk, "Ready to ship")).getByRole("button", { name: "Move to ready to ship" }).click();
  await expect(desk.getByTestId("order-status")).toHaveText("Ready to ship");

  const ship = await moveTo(desk, "Shipped");
  await ship.getByRole("button", { name: "Move to shipped" }).click();
  await expect(ship.getByText("Name the carrier the bank ships with.")).toBeVisible();
  await ship.getByLabel("Carrier").fill("Tollway Freight");
  await ship.getByLabel("Tracking reference").fill("TW-55812-KB");
  await ship.getByRole("button", { name: "Move to shipped" }).click();
  await expect(desk.getByTestId("order-status")).toHaveText("Shipped");
  await (await moveTo(desk, "Delivered")).getByRole("button", { name: "Move to delivered" }).click();
  await expect(desk.getByTestId("order-status")).toHaveText("Delivered");
  await staff.close();

  // The customer sees the whole timeline and downloads the certificate.
  await page.reload();
  await expect(page.getByTestId("order-status")).toHaveText("Delivered");
  const timeline = page.getByTestId("order-timeline");
  for (const stage of ["Paid", "Kitting", "Assembling", "Testing", "Ready to ship", "Shipped", "Delivered"]) await expect(timeline).toContainText(stage);
  await expect(timeline).toContainText("Cells pulled from graded stock");
  await expect(page.getByText("Tollway Freight, tracking TW-55812-KB")).toBeVisible();
  await expectNoSeriousA11y(page, "the delivered order with its timeline");
  const href = await page.getByRole("link", { name: "Download the test certificate" }).getAttribute("href");
  const pdf = await page.request.get(href ?? "");
  expect(pdf.status()).toBe(200);
  const bytes = await pdf.body();
  // ISO 32000-1 §7.5.2: a PDF file starts with "%PDF-"
  expect(bytes.subarray(0, 5).toString("latin1")).toBe("%PDF-");
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "certificate-"));
  fs.writeFileSync(path.join(dir, "c.pdf"), bytes);
  // pdftotext (poppler-utils) reads the certificate as a reader would
  const text = execFileSync("pdftotext", ["-layout", path.join(dir, "c.pdf"), "-"], { encoding: "utf8" });
  expect(text).toContain(`Test certificate ${orderNumber}`);
  expect(text).toMatch(/Bank 1: PASSED/);

  // Every e-mail arrived: confirmed, ready, shipped (with carrier and tracking), delivered.
  await waitForMail(email, new RegExp(`Order ${orderNumber} has passed its tests`));
  const shipped = await waitForMail(email, new RegExp(`Order ${orderNumber} has shipped with Tollway Freight`));
  expect(shipped.text ?? "").toContain("TW-55812-KB");
  await waitForMail(email, new RegExp(`Order ${orderNumber} was delivered`));
  expect((await mailsTo(email)).filter((m) => m.subject.includes(orderNumber))).toHaveLength(4);
});

test("a customer who cancels on the hosted page comes back to the quote, with nothing charged", async ({ page }) => {
  const email = `oren.vask.${unique()}@larchmoor-rail.example`;
  const { quoteNumber } = await newCustomerQuote(page, "Oren Vask", email, "larchmoor-yard-password");
  const pay = page.getByTestId("pay-section");
  await pay.getByLabel(/Deposit/).check();
  await pay.getByRole("button", { name: /^Accept and pay / }).click();
  await page.getByRole("link", { name: "Cancel and go back" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${K}/quotes/${quoteNumber}\\?checkout=cancelled$`));
  await expect(page.getByTestId("pay-section")).toContainText("Payment cancelled: nothing was charged.");
  await expect(page.getByTestId("pay-section")).toContainText("A payment page is already open for the deposit");
});
