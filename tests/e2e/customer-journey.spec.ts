import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Page } from "@playwright/test";
import { expectNoSeriousA11y } from "./a11y";
import { expect, test } from "./fixtures";
import { signIn, unique } from "./helpers";

const K = "kestrel-bank-works";
const KESTREL_ESTIMATOR = "casimir.oyelaran@kestrel-bank-works.example";
const INBOX = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:1080";

interface InboxMail {
  id: string;
  subject: string;
  to: { address: string }[];
  attachments?: { filename?: string; generatedFileName: string; contentType: string }[];
}

/** Money as shown ("€1,208.30") → its digits and decimal mark only ("1,208.30"), to compare across fonts. */
const amountOf = (money: string) => money.replace(/[^\d.,]/g, "");

async function fillRequest(page: Page, values: { max: string; min?: string; energy?: string; capacitance?: string }) {
  await page.getByLabel("Maximum voltage").fill(values.max);
  if (values.min) await page.getByLabel("Minimum voltage (optional)").fill(values.min);
  if (values.capacitance) {
    await page.getByText("Capacitance", { exact: true }).click();
    await page.getByLabel("Capacitance needed").fill(values.capacitance);
  }
  if (values.energy) await page.getByLabel("Usable energy needed").fill(values.energy);
}

/** The per-bank prices in the table's current order, as exact decimal strings. */
async function pricesInOrder(page: Page): Promise<number[]> {
  const cells = await page.getByTestId("options-table").locator("tbody tr td:nth-child(11)").allInnerTexts();
  // parsed only to compare order; each is the first line, e.g. "€1,006.92"
  return cells.map((t) => Number(amountOf(t.split("\n")[0] ?? "").replace(/,/g, "")));
}

test("a visitor compares arrangements, signs up, chooses one and gets the quote as a PDF and by e-mail", async ({ page }) => {
  test.setTimeout(180_000);
  const id = unique();
  const email = `ilse.marrow.${id}@brackwater-ferries.example`;

  await page.goto(`/s/${K}`);
  // A bad value is explained at its field.
  await page.getByLabel("Maximum voltage").fill("48 A");
  await page.getByLabel("Minimum voltage (optional)").click();
  await expect(page.getByText(/"48 A" is not a value in volts/)).toBeVisible();

  // 48 V, 20 kJ usable down to 24 V; the form derives the capacitance as it is typed:
  // C = 2E / (Vmax² − Vmin²) = 40 000 / 1728 = 23.1 F (E = ½·C·V², OpenStax University Physics Vol. 2, §8.3).
  await fillRequest(page, { max: "48 V", min: "24 V", energy: "20 kJ" });
  await expect(page.getByTestId("derived-figures")).toContainText("23.1 F");
  await page.getByRole("button", { name: "Show arrangements" }).click();
  const table = page.getByTestId("options-table");
  await expect(table).toBeVisible();
  const rows = table.locator("tbody tr");
  expect(await rows.count()).toBeGreaterThan(1);

  // The options come ranked by price, and the price column says so; one click turns the order round.
  const ranked = await pricesInOrder(page);
  expect(ranked).toEqual([...ranked].sort((a, b) => a - b));
  const priceHeader = table.getByRole("columnheader", { name: /Price/ });
  await expect(priceHeader).toHaveAttribute("aria-sort", "ascending");
  await priceHeader.getByRole("button").click();
  await expect(priceHeader).toHaveAttribute("aria-sort", "descending");
  const descending = await pricesInOrder(page);
  expect(descending).toEqual([...ranked].sort((a, b) => b - a));
  await priceHeader.getByRole("button").click();
  await expect(priceHeader).toHaveAttribute("aria-sort", "ascending");

  // Focus another row: its heading, diagram and charts show.
  const second = rows.nth(1);
  const secondId = (await second.getAttribute("data-option")) ?? "";
  const [sku, , seriesCount, parallelCount] = secondId.split("|");
  await second.getByRole("radio").check();
  const focused = page.getByTestId("focused-option");
  await expect(focused.getByRole("heading", { level: 3 })).toContainText(`${sku}: ${seriesCount} S × ${parallelCount} P`);
  await expect(focused.getByTestId("bank-diagram")).toBeVisible();
  // each chart loads as its place scrolls into view
  for (const slot of ["cell-voltage", "discharge", "price-mass"]) await page.locator(`[data-chart-slot="${slot}"]`).scrollIntoViewIfNeeded();
  await expect(focused.getByTestId("cell-voltage-chart").locator("svg").first()).toBeVisible();
  await expect(focused.getByTestId("discharge-chart").locator("svg").first()).toBeVisible();
  await expect(page.getByTestId("price-mass-chart").locator("svg").first()).toBeVisible();
  await expect(focused.getByRole("note", { name: "Safety cautions" })).toBeVisible();
  const focusedTitle = (await focused.getByRole("heading", { level: 3 }).innerText()).trim();

  // Choosing asks a visitor to sign in or sign up; signing up brings them back to the same search.
  await focused.getByRole("button", { name: "Choose this arrangement" }).click();
  await page.getByTestId("sign-in-prompt").getByRole("link", { name: "Create a customer account" }).click();
  await expect(page).toHaveURL(/\/join\?next=/);
  await page.getByLabel("Your name").fill("Ilse Marrow");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("ferry-deck-password");
  await page.getByRole("button", { name: "Create my account" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${K}$`));
  await expect(page.getByRole("link", { name: "My quotes" })).toBeVisible();
  await expect(page.getByLabel("Maximum voltage")).toHaveValue("48 V");
  await expect(page.getByLabel("Usable energy needed")).toHaveValue("20 kJ");
  await expect(page.getByTestId("focused-option").getByRole("heading", { level: 3 })).toHaveText(focusedTitle);

  // Choose: a quote, numbered per shop, for the total the storefront showed for this option.
  const shownTotal = (await page.getByTestId("focused-option").getByTestId("option-total").innerText()).trim();
  await page.getByTestId("focused-option").getByRole("button", { name: "Choose this arrangement" }).click();
  // Before anything is issued, the customer sees what will be quoted and confirms.
  const review = page.getByTestId("choice-review");
  await expect(review).toContainText(shownTotal);
  await expect(review).toContainText(/Valid for\s*30 days/);
  await review.getByRole("button", { name: "Confirm and get the quote" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${K}/quotes/Q-\\d{4}-\\d{4}$`), { timeout: 30_000 });
  const quoteNumber = (await page.getByTestId("quote-number").innerText()).trim();
  const total = (await page.getByTestId("quote-total").innerText()).trim();
  expect(quoteNumber).toMatch(/^Q-\d{4}-\d{4}$/);
  expect(total).toBe(shownTotal);
  await expectNoSeriousA11y(page, "the customer's quote at desktop width");

  // The PDF downloads from the quote page and holds the number and the total shown.
  const href = await page.getByRole("link", { name: /Download PDF/ }).getAttribute("href");
  expect(href).toBeTruthy();
  const pdf = await page.request.get(href ?? "");
  expect(pdf.status()).toBe(200);
  const bytes = await pdf.body();
  // ISO 32000-1 §7.5.2: a PDF file starts with "%PDF-"
  expect(bytes.subarray(0, 5).toString("latin1")).toBe("%PDF-");
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "quote-pdf-"));
  const file = path.join(dir, "quote.pdf");
  fs.writeFileSync(file, bytes);
  // pdftotext (poppler-utils) reads the text layer as a reader would: the PDF's grand total is the page's
  const text = execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
  expect(text).toContain(quoteNumber);
  const pdfTotal = /Total \(EUR\)\s+(\S+)/.exec(text)?.[1];
  expect(pdfTotal, "the PDF's total line").toBeDefined();
  expect(amountOf(pdfTotal ?? "")).toBe(amountOf(total));
  expect(pdfTotal).toBe(total);

  // The e-mail arrives with the PDF attached.
  let mail: InboxMail | undefined;
  const until = Date.now() + 30_000;
  while (!mail && Date.now() < until) {
    const res = await fetch(`${INBOX}/api/email`);
    if (res.ok) mail = ((await res.json()) as InboxMail[]).find((m) => m.to.some((t) => t.address === email));
    if (!mail) await new Promise((r) => setTimeout(r, 500));
  }
  expect(mail, `an e-mail to ${email} within 30 s`).toBeTruthy();
  expect(mail?.subject).toContain(quoteNumber);
  const attached = (mail?.attachments ?? []).filter((a) => a.contentType === "application/pdf");
  expect(attached).toHaveLength(1);
});

test("a request beyond the shop's auto-quote limits lands on the estimators' list as needs review", async ({ page, browser }) => {
  test.setTimeout(120_000);
  const id = unique();
  const email = `tobin.searle.${id}@harl-quarry.example`;

  // Sign up first, from the storefront.
  await page.goto(`/s/${K}/join`);
  await page.getByLabel("Your name").fill("Tobin Searle");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("quarry-crane-password");
  await page.getByRole("button", { name: "Create my account" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${K}$`));

  // 60 V with 1200 F stores ½·C·V² = ½ × 1200 × 60² = 2.16 MJ at the requirement already, so every
  // option's energy at its rating is beyond the default 2 MJ the shop quotes automatically.
  await fillRequest(page, { max: "60 V", capacitance: "1200 F" });
  await page.getByRole("button", { name: "Show arrangements" }).click();
  await expect(page.getByTestId("options-table")).toBeVisible();
  await page.getByTestId("focused-option").getByRole("button", { name: "Choose this arrangement" }).click();
  await page.getByTestId("choice-review").getByRole("button", { name: "Confirm and get the quote" }).click();
  await expect(page.getByTestId("review-notice")).toHaveText(/Sent to the shop's estimators; you will hear by e-mail/);
  await expect(page).toHaveURL(new RegExp(`/s/${K}$`));

  const staff = await browser.newContext();
  const desk = await staff.newPage();
  await signIn(desk, KESTREL_ESTIMATOR);
  await desk.goto(`/desk/${K}/requests`);
  const row = desk.getByRole("row").filter({ hasText: email });
  await expect(row).toHaveCount(1);
  await expect(row).toContainText(/needs review/i);
  await staff.close();
});

test("a search that cannot reach the shop is explained beside the form, which keeps what was typed", async ({ page }) => {
  await page.goto(`/s/${K}`);
  await fillRequest(page, { max: "48 V", min: "24 V", energy: "20 kJ" });
  // the storefront's search is a server action: a POST to the page carrying a Next-Action header
  await page.route(`**/s/${K}`, (route) => (route.request().method() === "POST" ? route.abort("connectionreset") : route.continue()));
  await page.getByRole("button", { name: "Show arrangements" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "could not be reached" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Describe your bank" })).toBeVisible();
  await expect(page.getByLabel("Maximum voltage")).toHaveValue("48 V");
  await expect(page.getByLabel("Usable energy needed")).toHaveValue("20 kJ");
  // back on line, the same form searches
  await page.unroute(`**/s/${K}`);
  await page.getByRole("button", { name: "Show arrangements" }).click();
  await expect(page.getByTestId("options-table")).toBeVisible();
});
