// Every page, for every role, through axe-core (@axe-core/playwright; WCAG 2.2 A/AA rules): no
// serious or critical violation, with the storefront's options, charts and diagram on screen, and a
// pass at 390 px (a phone held upright) through the journey: request, options, review, quote.
import type { Page } from "@playwright/test";
import { expectNoSeriousA11y } from "./a11y";
import { expect, test } from "./fixtures";
import { signIn, unique } from "./helpers";

const K = "kestrel-bank-works";
const MANAGER = "ottilie.brandvold@kestrel-bank-works.example";
const ESTIMATOR = "casimir.oyelaran@kestrel-bank-works.example";
const CUSTOMER = "renske.haddow@tollmere-tramways.example";

/** The desk's sections (app/desk/[shop]/_components/desk-sections.ts) and a few pages under them. */
const DESK_PAGES = [
  "",
  "requests",
  "quotes",
  "catalog",
  "catalog/components",
  "catalog/import",
  "catalog/cells/new",
  "pricing",
  "orders",
  "orders/list",
  "dashboard",
  "team",
  "outbox",
  "webhooks",
  "settings",
  "api-keys",
];

async function showOptions(page: Page) {
  await page.goto(`/s/${K}`);
  await page.getByLabel("Maximum voltage").fill("48 V");
  await page.getByLabel("Minimum voltage (optional)").fill("24 V");
  await page.getByLabel("Usable energy needed").fill("20 kJ");
  await page.getByRole("button", { name: "Show arrangements" }).click();
  const focused = page.getByTestId("focused-option");
  await expect(page.getByTestId("options-table")).toBeVisible();
  await expect(focused.getByTestId("bank-diagram")).toBeVisible();
  // each chart loads as its place scrolls into view
  for (const slot of ["cell-voltage", "discharge", "price-mass"]) await page.locator(`[data-chart-slot="${slot}"]`).scrollIntoViewIfNeeded();
  await expect(focused.getByTestId("cell-voltage-chart").locator("svg").first()).toBeVisible();
  await expect(focused.getByTestId("discharge-chart").locator("svg").first()).toBeVisible();
  await expect(page.getByTestId("price-mass-chart").locator("svg").first()).toBeVisible();
}

test("a visitor's pages: the landing page, signing in, opening a shop, joining, the storefront with its options", async ({ page }) => {
  test.setTimeout(120_000);
  for (const path of ["/", "/sign-in", "/open-shop", `/s/${K}/join`, `/s/${K}`]) {
    await page.goto(path);
    await expectNoSeriousA11y(page, path);
  }
  // a field in error
  await page.getByLabel("Maximum voltage").fill("48 A");
  await page.getByLabel("Minimum voltage (optional)").click();
  await expect(page.getByText(/"48 A" is not a value in volts/)).toBeVisible();
  await expectNoSeriousA11y(page, "the storefront with a field in error");
  await showOptions(page);
  await expectNoSeriousA11y(page, "the storefront with options, charts and diagram");
  // The charts are named pictures with a summary in words, not unnamed tab stops.
  for (const id of ["cell-voltage-chart", "discharge-chart", "price-mass-chart"]) {
    const chart = page.getByTestId(id);
    await expect(chart).toHaveAttribute("role", "img");
    await expect(chart).toHaveAccessibleName(/\w/);
    await expect(chart).toHaveAccessibleDescription(/\w/);
    await expect(chart.locator("[tabindex='0']")).toHaveCount(0);
  }
  // The first tab stop skips to the page's main content.
  await page.goto(`/s/${K}`);
  await page.keyboard.press("Tab");
  const skip = page.getByRole("link", { name: "Skip to content" });
  await expect(skip).toBeFocused();
  await page.keyboard.press("Enter");
  await expect(page).toHaveURL(/#main$/);
});

test("a customer's pages: the storefront, the review before a quote, my quotes and orders, my shops", async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, CUSTOMER);
  await showOptions(page);
  await page.getByTestId("focused-option").getByRole("button", { name: "Choose this arrangement" }).click();
  await expect(page.getByTestId("choice-review")).toBeVisible();
  await expectNoSeriousA11y(page, "the storefront's review before a quote");
  for (const path of [`/s/${K}/quotes`, `/s/${K}/orders`, "/my-shops"]) {
    await page.goto(path);
    await expectNoSeriousA11y(page, path);
  }
});

for (const [role, email] of [
  ["manager", MANAGER],
  ["estimator", ESTIMATOR],
] as const) {
  test(`the ${role}'s desk: every section it can open`, async ({ page }) => {
    test.setTimeout(180_000);
    await signIn(page, email);
    const titles: string[] = [];
    for (const section of DESK_PAGES) {
      const path = `/desk/${K}/${section}`;
      const res = await page.goto(path);
      // a section the role may not open answers 403 with the "not allowed" page, which is checked too
      expect([200, 403]).toContain(res?.status());
      if (res?.status() === 200) titles.push(await page.title());
      await expectNoSeriousA11y(page, `${path} as ${role}`);
    }
    // every page the role opens has a browser-tab title of its own
    expect(
      titles.filter((t, i) => titles.indexOf(t) !== i),
      "titles used twice",
    ).toEqual([]);
    // a catalog line
    await page.goto(`/desk/${K}/catalog`);
    await page.getByRole("table").locator("tbody a").first().click();
    await expect(page).toHaveURL(/\/catalog\/cells\/[^/]+$/);
    await expectNoSeriousA11y(page, `a cell as ${role}`);
  });
}

test("at 390 px: the request, the options (the wide table shows it scrolls), the review and the quote with its total in view", async ({ browser }) => {
  test.setTimeout(180_000);
  const context = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
  const page = await context.newPage();
  const email = `maren.quill.${unique()}@saltholm-ferries.example`;
  await page.goto(`/s/${K}/join`);
  await page.waitForLoadState("networkidle");
  await page.getByLabel("Your name").fill("Maren Quill");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("saltholm-quay-password");
  await page.getByRole("button", { name: "Create my account" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${K}$`));

  const noSidewaysScroll = async (where: string) => {
    const [scrollWidth, innerWidth] = await page.evaluate(() => [document.documentElement.scrollWidth, window.innerWidth]);
    expect(scrollWidth, `${where} is no wider than the screen`).toBeLessThanOrEqual(innerWidth);
  };
  await expectNoSeriousA11y(page, "the storefront at 390 px");
  await noSidewaysScroll("the storefront");
  await showOptions(page);
  await expectNoSeriousA11y(page, "the options at 390 px");
  await noSidewaysScroll("the storefront with options");
  // the options table scrolls inside its own frame, which says so
  const frame = page.getByTestId("options-table-frame");
  await expect(frame).toHaveAttribute("role", "region");
  await expect(frame).toHaveAccessibleName(/scroll/i);
  expect(await frame.evaluate((el) => el.scrollWidth > el.clientWidth)).toBe(true);
  // the focused option's total is on screen without scrolling sideways
  const total = page.getByTestId("focused-option").getByTestId("option-total");
  await total.scrollIntoViewIfNeeded();
  const box = await total.boundingBox();
  expect(box && box.x >= 0 && box.x + box.width <= 390).toBe(true);

  await page.getByTestId("focused-option").getByRole("button", { name: "Choose this arrangement" }).click();
  await page.getByTestId("choice-review").getByRole("button", { name: "Confirm and get the quote" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${K}/quotes/Q-\\d{4}-\\d{4}$`), { timeout: 30_000 });
  await expectNoSeriousA11y(page, "the quote at 390 px");
  await noSidewaysScroll("the quote");
  const quoteTotal = page.getByTestId("quote-total");
  await quoteTotal.scrollIntoViewIfNeeded();
  const tb = await quoteTotal.boundingBox();
  expect(tb && tb.x >= 0 && tb.x + tb.width <= 390, "the quote's total is within the screen's width").toBe(true);
  const number = (await page.getByTestId("quote-number").innerText()).trim();

  // the same quote and the desk's busiest pages on the estimator's phone
  const staff = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const desk = await staff.newPage();
  await signIn(desk, ESTIMATOR);
  await desk.goto(`/desk/${K}/quotes/${number}`);
  await expect(desk.getByRole("heading", { level: 1 })).toContainText(number);
  await expectNoSeriousA11y(desk, "a quote on the desk at 390 px");
  for (const section of ["", "requests", "quotes", "catalog", "orders", "orders/list"]) {
    await desk.goto(`/desk/${K}/${section}`);
    await expectNoSeriousA11y(desk, `/desk/${K}/${section} at 390 px`);
  }
  await staff.close();
  await context.close();
});
