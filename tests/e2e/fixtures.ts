import { expect, test as base, type BrowserContext, type Page } from "@playwright/test";

/**
 * Every browser test runs under the app's Content-Security-Policy and fails if the page breaks
 * it: each `securitypolicyviolation` event and each console report of a refused resource is
 * collected, in every page of the test's browser context. A test that provokes a violation on
 * purpose reads and clears `cspViolations` itself.
 */
export const test = base.extend<{ cspViolations: string[] }>({
  cspViolations: [
    async ({ context, browser }, use) => {
      const violations: string[] = [];
      const watchPage = (page: Page) =>
        page.on("console", (message) => {
          if (message.type() === "error" && /Content Security Policy/i.test(message.text())) violations.push(`console: ${message.text()}`);
        });
      const watch = async (c: BrowserContext) => {
        await c.exposeBinding("__faradsmithCspViolation", (_source, report: string) => {
          violations.push(report);
        });
        await c.addInitScript(() => {
          document.addEventListener("securitypolicyviolation", (e) => {
            const report = `${e.violatedDirective} blocked ${e.blockedURI || "inline"} at ${e.sourceFile || document.location.href}:${e.lineNumber}`;
            (window as unknown as { __faradsmithCspViolation?: (r: string) => void }).__faradsmithCspViolation?.(report);
          });
        });
        c.pages().forEach(watchPage);
        c.on("page", watchPage);
      };
      await watch(context);
      // contexts a test opens for a second person are watched too
      const newContext = browser.newContext.bind(browser);
      browser.newContext = async (...args: Parameters<typeof newContext>) => {
        const c = await newContext(...args);
        await watch(c);
        return c;
      };
      try {
        await use(violations);
      } finally {
        browser.newContext = newContext;
      }
      expect(violations, "Content-Security-Policy violations").toEqual([]);
    },
    { auto: true },
  ],
});

export { expect };
