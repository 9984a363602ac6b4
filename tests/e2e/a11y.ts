import AxeBuilder from "@axe-core/playwright";
import { expect, type Page } from "@playwright/test";

/**
 * axe-core (@axe-core/playwright, rules for WCAG 2.0–2.2 A and AA plus best practices) over the
 * page as it stands: no serious or critical violation. Each one is listed with its rule and the
 * elements it found, so a failure says what to fix.
 *
 * After a client-side navigation the page's title is streamed in with its metadata, a moment after
 * the URL changes; axe runs once the title has arrived, so a page that never gets one still fails
 * here (by timeout, with that message) and one that is merely mid-navigation does not.
 */
export async function expectNoSeriousA11y(page: Page, where = page.url()) {
  await page.waitForLoadState("load");
  await expect.poll(() => page.title(), { message: `${where} has a document title`, timeout: 10_000 }).not.toBe("");
  const results = await new AxeBuilder({ page }).analyze();
  const serious = results.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
  expect(serious, `serious or critical accessibility violations on ${where}`).toEqual([]);
}
