import AxeBuilder from "@axe-core/playwright";
import { expect, type Page } from "@playwright/test";

/**
 * axe-core (@axe-core/playwright, rules for WCAG 2.0–2.2 A and AA plus best practices) over the
 * page as it stands: no serious or critical violation. Each one is listed with its rule and the
 * elements it found, so a failure says what to fix.
 */
export async function expectNoSeriousA11y(page: Page, where = page.url()) {
  const results = await new AxeBuilder({ page }).analyze();
  const serious = results.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
  expect(serious, `serious or critical accessibility violations on ${where}`).toEqual([]);
}
