import { expect, test } from "./fixtures";
import { signIn, unique } from "./helpers";

const K = "kestrel-bank-works";
const M = "marlow-pulse";
const kestrel = {
  manager: "ottilie.brandvold@kestrel-bank-works.example",
  estimator: "casimir.oyelaran@kestrel-bank-works.example",
  customer: "renske.haddow@tollmere-tramways.example",
};

test("a manager opens a shop, a customer joins it on the storefront, and the manager makes them an estimator", async ({ page, browser }) => {
  const id = unique();
  const slug = `north-coast-${id}`;

  await page.goto("/open-shop");
  // Bad input first: every field says what is wrong and nothing is created.
  await page.getByLabel("Your name").fill("Ada Quill");
  await page.getByLabel("E-mail").fill("ada@");
  await page.getByLabel("Password").fill("short");
  await page.getByLabel("Shop name").fill("North Coast Banks");
  await page.getByLabel("Web address").fill("north coast");
  await page.getByRole("button", { name: "Open the shop" }).click();
  await expect(page.getByText("Enter an e-mail address like name@example.com.")).toBeVisible();
  await expect(page.getByText("At least 10 characters.")).toBeVisible();
  await expect(page.getByText(/No spaces/)).toBeVisible();
  await expect(page).toHaveURL(/\/open-shop$/);

  // A taken slug is refused at its field by the server.
  await page.getByLabel("E-mail").fill(`ada.${id}@north-coast.example`);
  await page.getByLabel("Password").fill("a-long-enough-password");
  await page.getByLabel("Web address").fill(K);
  await page.getByRole("button", { name: "Open the shop" }).click();
  await expect(page.getByText("That address is taken; choose another.")).toBeVisible();
  await expect(page).toHaveURL(/\/open-shop$/);

  await page.getByLabel("Web address").fill(slug);
  await page.getByRole("button", { name: "Open the shop" }).click();
  await expect(page).toHaveURL(new RegExp(`/desk/${slug}$`));
  await expect(page.getByRole("heading", { name: "Today at North Coast Banks" })).toBeVisible();
  await expect(page.getByRole("navigation", { name: "Desk" }).getByRole("link", { name: "Team" })).toBeVisible();

  // A customer signs up on the new shop's storefront.
  const customer = await browser.newContext();
  const cpage = await customer.newPage();
  await cpage.goto(`/s/${slug}`);
  await cpage.getByRole("link", { name: "Create an account" }).click();
  await cpage.getByRole("button", { name: "Create my account" }).click();
  await expect(cpage.getByText("Enter your name (at least 2 characters).")).toBeVisible();
  await cpage.getByLabel("Your name").fill("Bram Tollis");
  await cpage.getByLabel("E-mail").fill(`bram.${id}@tollis-cranes.example`);
  await cpage.getByLabel("Password").fill("another-long-password");
  await cpage.getByRole("button", { name: "Create my account" }).click();
  await expect(cpage).toHaveURL(new RegExp(`/s/${slug}$`));
  await expect(cpage.getByRole("link", { name: "My quotes" })).toBeVisible();
  await cpage.goto(`/desk/${slug}`);
  await expect(cpage.getByRole("heading", { name: "This page is not open to your role" })).toBeVisible();

  // The manager sees the new customer on the team page and moves them to estimator.
  await page.getByRole("navigation", { name: "Desk" }).getByRole("link", { name: "Team" }).click();
  const row = page.getByTestId(`member-bram.${id}@tollis-cranes.example`);
  await expect(row).toContainText("Bram Tollis");
  // Picking a role only proposes it; it is saved once confirmed.
  await row.getByLabel("Role of Bram Tollis").selectOption("estimator");
  await expect(row.getByRole("status")).toHaveCount(0);
  await row.getByRole("button", { name: "Change role" }).click();
  await expect(row.getByRole("status")).toHaveText("Saved");

  // On their next page the former customer has the estimator's desk, but not the audit log.
  await cpage.goto(`/desk/${slug}/catalog`);
  await expect(cpage.getByRole("heading", { name: "Catalog" })).toBeVisible();
  await cpage.goto(`/desk/${slug}/audit`);
  await expect(cpage.getByRole("heading", { name: "This page is not open to your role" })).toBeVisible();
  await customer.close();

  // The manager's audit log has the change, with who made it; filtered by person through the URL.
  await page.getByRole("navigation", { name: "Desk" }).getByRole("link", { name: "Audit log" }).click();
  const entries = page.getByRole("table", { name: "Audit entries" });
  await expect(entries.getByRole("row")).toHaveCount(2);
  await expect(entries).toContainText(`Role of Bram Tollis (bram.${id}@tollis-cranes.example) from Customer to Estimator`);
  await expect(entries).toContainText("Ada Quill");
  await page.getByLabel("Who").selectOption({ label: "Ada Quill" });
  await page.getByRole("button", { name: "Filter" }).click();
  await expect(page).toHaveURL(/[?&]actor=/);
  await expect(entries.getByRole("row")).toHaveCount(2);
});

test.describe("each role reaches its own pages and is refused the others'", () => {
  const deskPages = ["", "/requests", "/quotes", "/catalog", "/pricing", "/orders", "/team", "/outbox", "/audit", "/settings"];
  const managerOnly = new Set(["/team", "/outbox", "/audit", "/settings"]);

  test("manager", async ({ page }) => {
    await signIn(page, kestrel.manager);
    for (const p of deskPages) {
      await page.goto(`/desk/${K}${p}`);
      await expect(page.getByRole("heading", { name: "This page is not open to your role" }), `/desk/${K}${p}`).toHaveCount(0);
      await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
    }
    // Not a member of the other shop.
    await page.goto(`/desk/${M}`);
    await expect(page.getByRole("heading", { name: "This page is not open to your role" })).toBeVisible();
  });

  test("estimator", async ({ page }) => {
    await signIn(page, kestrel.estimator);
    for (const p of deskPages) {
      await page.goto(`/desk/${K}${p}`);
      const refused = page.getByRole("heading", { name: "This page is not open to your role" });
      if (managerOnly.has(p)) await expect(refused, `/desk/${K}${p}`).toBeVisible();
      else await expect(refused, `/desk/${K}${p}`).toHaveCount(0);
    }
    await expect(async () => {
      await page.goto(`/desk/${K}`);
      await expect(page.getByRole("navigation", { name: "Desk" }).getByRole("link", { name: "Team" })).toHaveCount(0);
    }).toPass();
    await page.goto(`/desk/${M}/catalog`);
    await expect(page.getByRole("heading", { name: "This page is not open to your role" })).toBeVisible();
  });

  test("customer", async ({ page }) => {
    await signIn(page, kestrel.customer);
    await expect(page).toHaveURL(new RegExp(`/s/${K}$`));
    await page.goto(`/s/${K}/quotes`);
    await expect(page.getByRole("heading", { name: "My quotes" })).toBeVisible();
    for (const p of deskPages) {
      await page.goto(`/desk/${K}${p}`);
      await expect(page.getByRole("heading", { name: "This page is not open to your role" }), `/desk/${K}${p}`).toBeVisible();
    }
  });

  test("visitor", async ({ page }) => {
    await page.goto(`/s/${K}`);
    await expect(page.getByRole("heading", { name: "Kestrel Bank Works", level: 1 })).toBeVisible();
    await page.goto(`/desk/${K}/catalog`);
    await expect(page).toHaveURL(/\/sign-in\?/);
    await page.goto(`/s/${K}/quotes`);
    await expect(page).toHaveURL(/\/sign-in\?/);
    const api = await page.request.get(`/api/v1/shops/${K}/members`);
    expect(api.status()).toBe(401);
    expect(await api.json()).toHaveProperty("error");
  });

  test("staff read the shop's quotes on the desk; the storefront's quote list is the customer's", async ({ page }) => {
    await signIn(page, kestrel.estimator);
    await page.goto(`/s/${K}/quotes`);
    await expect(page).toHaveURL(new RegExp(`/desk/${K}/quotes$`));
    await expect(page.getByRole("heading", { name: "Quotes", exact: true })).toBeVisible();
    await expect(page.getByRole("heading", { name: "My quotes" })).toHaveCount(0);
  });

  test("a desk list keeps its sort, filter and page in the URL; the first click sorts the useful way", async ({ page }) => {
    await signIn(page, kestrel.estimator);
    await page.goto(`/desk/${K}/catalog`);
    const table = page.getByRole("table", { name: "Catalog cells" });
    const cost = table.getByRole("columnheader", { name: /Unit cost/ });
    await expect(table.getByRole("columnheader", { name: /SKU/ })).toHaveAttribute("aria-sort", "ascending");
    await cost.getByRole("link").click();
    await expect(page).toHaveURL(/sort=cost/);
    await expect(cost).toHaveAttribute("aria-sort", "ascending");
    const costs = async () => (await table.locator("tbody tr td:nth-child(7)").allInnerTexts()).map((t) => Number(t.replace(/[^\d.]/g, "")));
    const ascending = await costs();
    expect(ascending.length).toBeGreaterThan(1);
    expect([...ascending].sort((a, b) => a - b)).toEqual(ascending);
    await cost.getByRole("link").click();
    await expect(cost).toHaveAttribute("aria-sort", "descending");
    // the next page continues the same order
    const firstPage = await costs();
    await page.getByRole("navigation", { name: "Pages" }).getByRole("link", { name: "Next" }).click();
    await expect(page).toHaveURL(/page=2/);
    await expect(page).toHaveURL(/sort=cost/);
    const secondPage = await costs();
    expect(Math.min(...firstPage)).toBeGreaterThanOrEqual(Math.max(...secondPage));
    // a filter keeps the sort and starts again at page 1; a reload shows the same list
    await page.getByLabel("Technology").selectOption("film");
    await page.getByRole("button", { name: "Filter" }).click();
    await expect(page).toHaveURL(/technology=film/);
    await expect(page).toHaveURL(/sort=cost/);
    await expect(page).not.toHaveURL(/page=/);
    await page.reload();
    await expect(cost).toHaveAttribute("aria-sort", "descending");
    const film = await table.locator("tbody tr td:nth-child(3)").allInnerTexts();
    expect(film.length).toBeGreaterThan(0);
    expect(new Set(film)).toEqual(new Set(["Film"]));
    const filmCosts = await costs();
    expect([...filmCosts].sort((a, b) => b - a)).toEqual(filmCosts);
    // a hostile URL falls back to the defaults instead of failing (a NUL byte is refused before any page: bad-bytes tests)
    await page.goto(`/desk/${K}/catalog?sort=%01&page=-4&size=abc&technology=plasma&q=%25`);
    await expect(page.getByRole("heading", { name: "Catalog", level: 1 })).toBeVisible();
    await expect(table.getByRole("columnheader", { name: /SKU/ })).toHaveAttribute("aria-sort", "ascending");
  });
});

test("signed out, a desk deep link asks to sign in and then opens the page asked for", async ({ page }) => {
  await page.goto(`/desk/${K}/outbox?status=failed`);
  await expect(page).toHaveURL(/\/sign-in\?/);
  await page.getByLabel("E-mail").fill(kestrel.manager);
  await page.getByLabel("Password").fill("faradsmith-demo-2026");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(new RegExp(`/desk/${K}/outbox\\?status=failed$`));
});
