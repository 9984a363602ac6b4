import { expect, test } from "./fixtures";
import { signIn } from "./helpers";

const MANAGER = "hollis.achterberg@marlow-pulse.example";

test("a manager registers a webhook endpoint, keeps its secret, and stops, starts and deletes it", async ({ page }) => {
  await signIn(page, MANAGER);
  await page.goto("/desk/marlow-pulse/webhooks");
  await expect(page.getByRole("heading", { name: "Webhooks", level: 1 })).toBeVisible();
  const address = page.getByLabel("Address", { exact: true });

  // the field explains a refusal: nothing is registered for a private address
  await address.fill("http://192.168.10.20/hooks");
  await page.getByRole("button", { name: "Add endpoint" }).click();
  await expect(page.getByText("192.168.10.20 is a private-network address")).toBeVisible();
  await address.fill("");
  await page.getByRole("checkbox", { name: /quote\.issued/ }).uncheck();
  await page.getByRole("checkbox", { name: /quote\.accepted/ }).uncheck();
  await page.getByRole("button", { name: "Add endpoint" }).click();
  await expect(page.getByText("Enter the address your system listens on.")).toBeVisible();
  await expect(page.getByText("Choose at least one event.")).toBeVisible();

  const url = `http://127.0.0.1:9/marlow-${Date.now().toString(36)}`;
  await address.fill(url);
  await page.getByLabel("Note (optional)").fill("Stock system");
  await page.getByRole("checkbox", { name: /order\.status_changed/ }).check();
  await page.getByRole("button", { name: "Add endpoint" }).click();
  const secret = await page.getByTestId("webhook-secret").textContent();
  expect(secret).toMatch(/^fsw_[A-Za-z0-9_-]{43}$/);
  await page.getByRole("button", { name: "I have stored it" }).click();

  await expect(page.getByRole("heading", { name: url })).toBeVisible();
  await expect(page.getByText(`Signing secret: …${secret?.slice(-4)}`)).toBeVisible();
  await expect(page.getByText(secret ?? "")).toHaveCount(0);
  await expect(page.getByText("Nothing sent yet")).toBeVisible();

  await page.getByRole("button", { name: "Stop sending" }).click();
  await expect(page.getByRole("button", { name: "Start sending" })).toBeVisible();
  await page.getByRole("button", { name: "Start sending" }).click();
  await expect(page.getByRole("button", { name: "Stop sending" })).toBeVisible();

  page.once("dialog", (d) => void d.accept());
  await page.getByRole("button", { name: "Delete" }).click();
  await expect(page).toHaveURL(/\/desk\/marlow-pulse\/webhooks$/);
  await expect(page.getByRole("link", { name: url })).toHaveCount(0);
});
