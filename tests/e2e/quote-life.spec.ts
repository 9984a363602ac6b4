import type { Browser, Page } from "@playwright/test";
import { expect, test } from "./fixtures";
import { signIn, unique } from "./helpers";

const K = "kestrel-bank-works";
const KESTREL_ESTIMATOR = "casimir.oyelaran@kestrel-bank-works.example";
const INBOX = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:1080";
/** A 1 × 1 PNG (the PNG signature and a minimal IHDR/IDAT/IEND), standing in for a drawing. */
const DRAWING = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==", "base64");

async function mailTo(address: string, subject: RegExp): Promise<{ subject: string; text?: string }> {
  const until = Date.now() + 30_000;
  for (;;) {
    const res = await fetch(`${INBOX}/api/email`);
    const found = res.ok
      ? ((await res.json()) as { subject: string; text?: string; to: { address: string }[] }[]).find(
          (m) => m.to.some((t) => t.address === address) && subject.test(m.subject),
        )
      : undefined;
    if (found) return found;
    if (Date.now() > until) throw new Error(`no e-mail to ${address} matching ${subject} within 30 s`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

async function staffPage(browser: Browser): Promise<Page> {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, KESTREL_ESTIMATOR);
  return page;
}

test("an estimator quotes a needs-review request with a custom mixed-cell bank, revises it when asked, and the customer accepts revision 3", async ({
  page,
  browser,
}) => {
  test.setTimeout(300_000);
  const id = unique();
  const email = `wynne.callard.${id}@orrin-cranes.example`;
  const notes = `Outdoor cabinet beside the crane rail (${id}); drawing attached.`;

  // The customer: a bank beyond the shop's auto-quote limits (60 V with 1200 F stores ½·C·V² = 2.16 MJ at
  // the requirement already, above the default 2 MJ), with notes and a drawing.
  await page.goto(`/s/${K}/join`);
  await page.getByLabel("Your name").fill("Wynne Callard");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("crane-rail-password");
  await page.getByRole("button", { name: "Create my account" }).click();
  await expect(page).toHaveURL(new RegExp(`/s/${K}$`));
  await page.getByLabel("Maximum voltage").fill("60 V");
  await page.getByText("Capacitance", { exact: true }).click();
  await page.getByLabel("Capacitance needed").fill("1200 F");
  await page.getByLabel("Notes (optional)").fill(notes);
  await page.getByLabel("Drawings and specifications (optional)").setInputFiles({ name: "cabinet-plan.png", mimeType: "image/png", buffer: DRAWING });
  await expect(page.getByRole("list", { name: "Attached files" })).toContainText("cabinet-plan.png");
  await page.getByRole("button", { name: "Show arrangements" }).click();
  await expect(page.getByTestId("options-table")).toBeVisible();
  await page.getByTestId("focused-option").getByRole("button", { name: "Choose this arrangement" }).click();
  await expect(page.getByTestId("review-notice")).toBeVisible();

  // The estimator is told, opens the request in the workbench and sees the notes and the drawing.
  await mailTo(KESTREL_ESTIMATOR, /^Request from Wynne Callard needs review$/);
  const desk = await staffPage(browser);
  await desk.goto(`/desk/${K}/requests?status=needs-review`);
  const row = desk.getByRole("row").filter({ hasText: email });
  await expect(row).toContainText("60 V, 1.2 kF, 1 bank");
  await row.getByRole("link", { name: "Review in the workbench" }).click();
  await expect(desk.getByTestId("request-notes")).toHaveText(notes);
  await expect(desk.getByRole("img", { name: "Attached drawing cabinet-plan.png" })).toBeVisible();

  // Revision 1: the customer's own choice, as the engine priced it.
  const options = desk.getByTestId("review-options");
  await expect(options).toBeVisible({ timeout: 30_000 });
  await expect(options.getByRole("radio", { checked: true })).toHaveCount(1);
  await desk.getByRole("button", { name: "Issue the quote (revision 1)" }).click();
  await expect(desk).toHaveURL(new RegExp(`/desk/${K}/quotes/Q-\\d{4}-\\d{4}$`), { timeout: 30_000 });
  const number = (await desk.getByTestId("quote-number").innerText()).trim();

  // Revision 2: a custom bank of mixed cells, built from the option in the network editor, by keyboard.
  await desk.getByRole("link", { name: "Revise in the workbench" }).click();
  await expect(options).toBeVisible({ timeout: 30_000 });
  await desk.getByRole("button", { name: "Start a custom bank from this option" }).click();
  const tree = desk.getByRole("tree", { name: "The bank, as groups and cells" });
  await expect(tree).toBeVisible();
  // a second part of the same rating and technology as the option's cell, added in parallel to group 1: a mixed bank
  const firstCell = await tree.getByRole("treeitem").nth(2).innerText();
  const sku = /· (\S+)/.exec(firstCell)?.[1] ?? "";
  const labels = await desk.getByLabel("Part for new cells").locator("option").allInnerTexts();
  const rating = (labels.find((l) => l.startsWith(`${sku} `)) ?? "").split(", ").slice(1).join(", ");
  const otherSku = (labels.find((l) => !l.startsWith(`${sku} `) && !l.includes("retired") && l.endsWith(rating)) ?? "").split(" — ")[0] ?? "";
  expect(otherSku, `another part rated like ${sku}`).not.toBe("");
  await desk.getByLabel("Part for new cells").selectOption(otherSku);
  await tree.getByRole("treeitem").first().focus();
  await desk.keyboard.press("ArrowDown");
  const firstGroup = tree.getByRole("treeitem", { selected: true });
  await expect(firstGroup).toContainText("1 · parallel group");
  await expect(firstGroup).toBeFocused();
  // "c" adds a cell of that part to the selected group, and the change is announced
  await desk.keyboard.press("c");
  await expect(desk.getByTestId("editor-said")).toHaveText(new RegExp(`^Added a cell of ${otherSku} to parallel group 1, which now has \\d+ members\\.$`));
  const added = tree.getByRole("treeitem", { selected: true });
  await expect(added).toBeFocused();
  await expect(added).toContainText(otherSku);
  // Enter goes to the selected cell's part
  await desk.keyboard.press("Enter");
  await expect(desk.getByLabel("Part of this cell")).toBeFocused();
  await expect(desk.getByLabel("Part of this cell")).toHaveValue(otherSku);
  await expect(desk.getByTestId("weakest-cell")).toBeVisible();
  await expect(desk.getByTestId("network-diagram")).toBeVisible();
  // a line, and a discount whose missing reason is refused at the field
  await desk.getByRole("button", { name: "Add freight" }).click();
  await desk.getByLabel(/^Unit price \(EUR\)$/).fill("140.00");
  await desk.getByLabel("Discount", { exact: true }).selectOption("percent");
  await desk.getByLabel("Percent").fill("5");
  await desk.getByRole("button", { name: `Issue revision 2 of ${number}` }).click();
  await expect(desk.getByRole("alert").filter({ hasText: /^Say why the discount is given$/ })).toBeVisible();
  await desk.getByLabel("Reason for the discount (required)").fill("Second bank for the same crane line");
  await desk.getByLabel(/^Note to the customer/).fill("Mixed cells in group 1 for a cooler first stage; freight by pallet.");
  await expect(desk.getByTestId("workbench-total")).toBeVisible();
  await desk.getByRole("button", { name: `Issue revision 2 of ${number}` }).click();
  await expect(desk).toHaveURL(new RegExp(`/desk/${K}/quotes/${number}$`), { timeout: 30_000 });
  await expect(desk.getByTestId("revision-2")).toContainText("Sent");
  await expect(desk.getByTestId("revision-1")).toContainText("Superseded");
  await expect(desk.getByTestId("network-diagram")).toBeVisible();

  // The customer is told, sees what changed from revision 1 to 2, and asks for a change.
  const updated = await mailTo(email, new RegExp(`${number} has been updated \\(revision 2\\)`));
  expect(updated.text ?? "").toContain("Mixed cells in group 1");
  await page.goto(`/s/${K}/quotes/${number}`);
  const diff = page.getByTestId("revision-diff");
  await expect(diff).toContainText("Added Freight");
  await expect(diff).toContainText("Discount (Second bank for the same crane line)");
  await expect(diff).toContainText("Custom bank from the shop's network editor");
  await page.getByRole("link", { name: "Ask for a change" }).click();
  await expect(page.getByLabel("Ask for a change to the quote")).toBeChecked();
  await page.getByLabel("What should change?").fill("We collect ourselves: please drop the freight.");
  await page.getByRole("button", { name: "Ask for the change" }).click();
  await expect(page.getByTestId("quote-thread").locator("[data-kind=change-request]")).toContainText("please drop the freight");
  await expect(page.getByTestId("quote-standing")).toContainText("Change asked for");
  await mailTo(KESTREL_ESTIMATOR, new RegExp(`Change asked for: quote ${number}`));

  // Revision 3: the estimator drops the freight line.
  await desk.goto(`/desk/${K}/quotes/${number}`);
  await expect(desk.getByTestId("quote-thread")).toContainText("please drop the freight");
  await desk.getByRole("link", { name: "Revise in the workbench" }).click();
  await expect(desk.getByText("We collect ourselves: please drop the freight.")).toBeVisible();
  await desk.getByRole("button", { name: "Remove line 1" }).click();
  await desk.getByRole("button", { name: `Issue revision 3 of ${number}` }).click();
  await expect(desk).toHaveURL(new RegExp(`/desk/${K}/quotes/${number}$`), { timeout: 30_000 });

  // The customer accepts revision 3; revision 2 can no longer be accepted.
  await page.goto(`/s/${K}/quotes/${number}`);
  await expect(page.getByTestId("revision-diff")).toContainText("Removed Freight");
  await page.getByRole("button", { name: "Accept revision 3" }).click();
  await page.getByRole("button", { name: "Yes, accept revision 3" }).click();
  await expect(page.getByTestId("quote-standing")).toContainText("You accepted revision 3.");
  await expect(page.getByTestId("revision-3")).toContainText("Accepted");
  await expect(page.getByTestId("revision-2")).toContainText("Superseded");
  await desk.context().close();
});
