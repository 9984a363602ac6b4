import type { Page } from "@playwright/test";
import { expect, test } from "./fixtures";
import { signIn } from "./helpers";

const K = "kestrel-bank-works";
const ESTIMATOR = "casimir.oyelaran@kestrel-bank-works.example";
const CUSTOMER = "renske.haddow@tollmere-tramways.example";

/** A customer's choice of the cheapest arrangement for 48 V → 24 V, 20 kJ: the quote page it lands on. */
async function quoteAs(page: Page, email: string): Promise<string> {
  await signIn(page, email);
  await page.goto(`/s/${K}`);
  await page.getByLabel("Maximum voltage").fill("48 V");
  await page.getByLabel("Minimum voltage (optional)").fill("24 V");
  await page.getByLabel("Usable energy needed").fill("20 kJ");
  await page.getByRole("button", { name: "Show arrangements" }).click();
  await expect(page.getByTestId("options-table")).toBeVisible();
  await page.getByTestId("focused-option").getByRole("button", { name: "Choose this arrangement" }).click();
  await page.getByTestId("choice-review").getByRole("button", { name: "Confirm and get the quote" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${K}/quotes/Q-\\d{4}-\\d{4}$`), { timeout: 30_000 });
  return (await page.getByTestId("quote-number").innerText()).trim();
}

test("a customer's new quote shows sell prices only; the desk shows the cost build-up with the margin", async ({ page, browser }) => {
  test.setTimeout(120_000);
  const number = await quoteAs(page, CUSTOMER);
  const lines = page.getByTestId("quote-price-lines");
  await expect(lines.locator("tbody tr")).toHaveCount(1);
  await expect(lines.locator("tbody tr")).toContainText("assembled and tested");
  await expect(lines).toContainText("Tax (19 %)");
  const body = await page.locator("article").first().innerText();
  for (const word of ["Overhead", "Labour", "Setup,", "Cell interconnects", "Terminal set", "Margin", "unit cost"]) expect(body, word).not.toContain(word);
  await expect(page.getByTestId("cost-build-up")).toHaveCount(0);

  const staff = await browser.newContext();
  const desk = await staff.newPage();
  await signIn(desk, ESTIMATOR);
  await desk.goto(`/desk/${K}/quotes/${number}`);
  const build = desk.getByTestId("cost-build-up");
  await expect(build).toContainText("Cell interconnects");
  await expect(build).toContainText("Margin per bank");
  await expect(desk.getByTestId("quote-total")).toHaveText(await page.getByTestId("quote-total").innerText());
  await staff.close();
});

test("an estimator edits a cell and a margin, sees what the change does, and saves", async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, ESTIMATOR);
  await page.goto(`/desk/${K}/catalog`);
  await page.getByRole("link", { name: "QFS-1200R27" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("QFS-1200R27");

  // a value in the wrong unit is explained at its field, and nothing is saved
  await page.getByLabel("Capacitance").fill("1200 V");
  await page.getByLabel("ESR").click();
  await expect(page.getByText(/"1200 V" is not a value in farads/)).toBeVisible();
  await page.getByLabel("Capacitance").fill("1.2 kF");
  await page.getByLabel("Unit cost (EUR)").fill("24.60");
  await page.getByRole("button", { name: "Save changes" }).click();
  await expect(page.getByText(/Saved as version \d+/)).toBeVisible();
  await expect(page.getByTestId("cost-history")).toContainText("€24.60");

  await page.goto(`/desk/${K}/pricing`);
  await page.getByLabel("Margin on price (%)").fill("28");
  await page.getByRole("button", { name: "Show what this change does" }).click();
  const preview = page.getByTestId("rules-preview");
  await expect(preview).toContainText("Margin on price: 26 % → 28 %");
  await expect(preview.getByTestId("preview-change").first()).toContainText("+");
  // the reason is required, at its field
  await page.getByRole("button", { name: /Save as version/ }).click();
  await expect(page.getByText(/Say why the rules change/)).toBeVisible();
  await page.getByLabel("Why the rules change").fill("Copper and labour costs up this quarter");
  await page.getByRole("button", { name: /Save as version/ }).click();
  await expect(page.getByText(/Saved as version \d+: 1 rule changed/)).toBeVisible();
  await page.reload();
  await expect(page.getByLabel("Margin on price (%)")).toHaveValue("28");
  await expect(page.getByRole("table", { name: "Pricing rule versions" })).toContainText("Copper and labour costs up this quarter");
  await expect(page.getByRole("table", { name: "Pricing rule versions" })).toContainText("26 % → 28 %");
});

test("an estimator imports a CSV with one bad row, sees it blocked at its row and column, fixes it and applies", async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, ESTIMATOR);
  await page.goto(`/desk/${K}/catalog/import`);
  await expect(page.getByRole("heading", { name: "The columns" })).toBeVisible();
  const file = (ratedVoltage: string) => ({
    name: "prices.csv",
    mimeType: "text/csv",
    buffer: Buffer.from(`sku,unitCost,ratedVoltage\r\nQFS-0650R27,16.90,2.7 V\r\nQFS-1500R27,27.95,${ratedVoltage}\r\n`),
  });
  await page.getByLabel("CSV file").setInputFiles(file("2.7 A"));
  const preview = page.getByTestId("import-preview");
  await expect(preview.getByTestId("import-counts")).toHaveText("0 new, 1 changed, 0 unchanged, 1 with errors");
  await expect(preview.locator('tr[data-status="error"]')).toContainText("3");
  await expect(preview.locator('tr[data-status="error"]')).toContainText(/ratedVoltage.*"2.7 A" is not a value in volts/);
  await expect(page.getByRole("button", { name: "Apply 1 change" })).toBeDisabled();

  await page.getByLabel("CSV file").setInputFiles(file("2.7 V"));
  await expect(preview.getByTestId("import-counts")).toHaveText("0 new, 2 changed, 0 unchanged, 0 with errors");
  await preview.getByLabel("Show").selectOption("changed");
  await expect(preview.locator('tr[data-status="changed"]').first()).toContainText("unitCost");
  await page.getByRole("button", { name: "Apply 2 changes" }).click();
  await expect(page.getByText("Imported: 0 new, 2 changed, 0 unchanged.")).toBeVisible();
  await page.goto(`/desk/${K}/catalog/cells/QFS-1500R27`);
  await expect(page.getByLabel("Unit cost (EUR)")).toHaveValue("27.95");
});
