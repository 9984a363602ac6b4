import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { expect, test } from "./fixtures";
import { signIn } from "./helpers";

const K = "kestrel-bank-works";
const KESTREL_CUSTOMER = "renske.haddow@tollmere-tramways.example";

test("a customer keeps the banks that survive a shorted cell, reads one's yield and life, compares three, and gets a quote whose PDF shows failures and life", async ({
  page,
}) => {
  test.setTimeout(180_000);
  await signIn(page, KESTREL_CUSTOMER);
  await page.goto(`/s/${K}`);
  await page.getByLabel("Maximum voltage").fill("48 V");
  await page.getByLabel("Minimum voltage (optional)").fill("24 V");
  await page.getByLabel("Usable energy needed").fill("20 kJ");
  await page.getByLabel("Ambient temperature").fill("35 °C");
  await page.getByRole("button", { name: "Show arrangements" }).click();
  const table = page.getByTestId("options-table");
  await expect(table).toBeVisible();

  // Before filtering some options do not survive a shorted cell; after it, none of them.
  const shortVerdicts = () => table.getByTestId("survives-cell").allInnerTexts();
  expect((await shortVerdicts()).some((t) => t.includes("✗ short"))).toBe(true);
  await page.getByLabel("Must survive").selectOption("short");
  await expect.poll(async () => (await shortVerdicts()).some((t) => t.includes("✗ short"))).toBe(false);
  const rows = table.locator("tbody tr");
  expect(await rows.count()).toBeGreaterThanOrEqual(3);

  // Focus the second: its failure verdicts, life and the yield histogram (loaded on focus) show.
  const second = rows.nth(1);
  const [sku, , seriesCount, parallelCount] = ((await second.getAttribute("data-option")) ?? "").split("|");
  await second.getByRole("radio").check();
  const focused = page.getByTestId("focused-option");
  await expect(focused.getByRole("heading", { level: 3 })).toContainText(`${sku}: ${seriesCount} S × ${parallelCount} P`);
  await expect(focused.getByTestId("failure-summary")).toContainText(/Survives one shorted cell: yes/);
  await expect(focused.getByTestId("life-summary")).toContainText("Expected life");
  await expect(focused.getByTestId("life-summary")).toContainText("35 °C");
  await expect(focused.getByTestId("yield-histogram")).toBeVisible();
  await expect(focused.getByTestId("yield-headline")).toContainText(/% of banks meet the requirement at end of life/);
  // one bar per bin of the seeded Monte-Carlo (lib/bank/option-yield.ts draws 30)
  expect(await focused.getByTestId("yield-histogram").locator("rect").count()).toBe(30);

  // Compare three side by side: columns for each, rows that differ marked, printable alone.
  for (let i = 0; i < 3; i++) await rows.nth(i).getByRole("checkbox").check();
  await page.getByRole("button", { name: "Compare 3 side by side" }).click();
  const sheet = page.getByTestId("compare-view");
  await expect(sheet).toBeVisible();
  await expect(sheet.locator("thead th")).toHaveCount(4);
  await expect(sheet.getByRole("rowheader", { name: /Survives one shorted cell/ })).toBeVisible();
  await expect(sheet.getByRole("rowheader", { name: /Expected life/ })).toBeVisible();
  await expect(sheet.getByRole("rowheader", { name: /Every cell within surge/ })).toBeVisible();
  await expect(sheet.getByRole("rowheader", { name: /Price per bank/ })).toBeVisible();
  expect(await sheet.locator("tr[data-differs]").count()).toBeGreaterThan(0);
  await page.emulateMedia({ media: "print" });
  await expect(sheet).toBeVisible();
  await expect(page.getByRole("button", { name: "Print" })).toBeHidden();
  await expect(page.getByTestId("options-table")).not.toBeVisible();
  await page.emulateMedia({ media: "screen" });

  // Choose the focused option: the quote page and its PDF carry the failure, yield and life sections.
  await focused.getByRole("button", { name: "Choose this arrangement" }).click();
  await focused.getByTestId("choice-review").getByRole("button", { name: "Confirm and get the quote" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${K}/quotes/Q-\\d{4}-\\d{4}$`), { timeout: 30_000 });
  const engineering = page.getByTestId("quote-engineering");
  await expect(engineering.getByTestId("quote-failures")).toContainText(/Survives one shorted cell: yes/);
  await expect(engineering.getByTestId("quote-life")).toContainText("35 °C");
  await expect(engineering.getByTestId("quote-yield").getByTestId("yield-histogram")).toBeVisible();
  const href = await page.getByRole("link", { name: /Download PDF/ }).getAttribute("href");
  const pdf = await page.request.get(href ?? "");
  expect(pdf.status()).toBe(200);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "quote-pdf-"));
  const file = path.join(dir, "quote.pdf");
  fs.writeFileSync(file, await pdf.body());
  // pdftotext (poppler-utils) reads the PDF's text layer as a reader would
  const text = execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" }).replace(/\s+/g, " ");
  expect(text).toContain("How the bank fails and how long it lasts");
  expect(text).toMatch(/Survives one shorted cell: yes/);
  expect(text).toMatch(/Survives one open cell: (yes|no)/);
  expect(text).toContain("Tolerance yield");
  expect(text).toContain("Temperature and expected life");
  expect(text).toContain("35 °C");
  fs.rmSync(dir, { recursive: true, force: true });
});
