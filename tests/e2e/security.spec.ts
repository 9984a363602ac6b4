import { expect, test } from "./fixtures";

const K = "kestrel-bank-works";

test("pages come with a nonce policy that their own scripts carry, and the security headers", async ({ page }) => {
  for (const path of ["/", "/sign-in", `/s/${K}`]) {
    const response = await page.goto(path);
    const headers = response?.headers() ?? {};
    const nonce = /'nonce-([^']+)'/.exec(headers["content-security-policy"] ?? "")?.[1];
    expect(nonce, path).toBeTruthy();
    expect(headers["content-security-policy"]).toContain("frame-ancestors 'none'");
    expect(headers["x-content-type-options"]).toBe("nosniff");
    expect(headers["referrer-policy"]).toBeTruthy();
    expect(headers["permissions-policy"]).toBeTruthy();
    // every script element the server wrote carries this response's nonce (chunks the runtime
    // loads later are trusted through 'strict-dynamic' and carry none)
    const scriptTags = (await response!.text()).match(/<script\b[^>]*>/g) ?? [];
    expect(scriptTags.length, path).toBeGreaterThan(0);
    for (const tag of scriptTags) expect(/\bnonce="([^"]*)"/.exec(tag)?.[1], `${path}: ${tag}`).toBe(nonce);
  }
});

test("markup injected into a page cannot run script", async ({ page, cspViolations }) => {
  await page.goto(`/s/${K}`);
  // the usual cross-site-scripting payloads, as if a name or note had been rendered as HTML
  await page.evaluate(() => {
    const box = document.createElement("div");
    box.innerHTML = `<img src="/no-such-image.png" onerror="window.__injected = 'handler'"><iframe srcdoc="<script>parent.__injected = 'frame'</script>"></iframe>`;
    document.body.append(box);
  });
  await expect.poll(() => cspViolations.length).toBeGreaterThanOrEqual(2);
  expect(await page.evaluate(() => (window as unknown as { __injected?: string }).__injected)).toBeUndefined();
  cspViolations.length = 0;
});

test("another site cannot show the app in a frame", async ({ page, baseURL }) => {
  // a page of another origin (a data: URL has an opaque one) that tries to frame the storefront
  await page.goto(`data:text/html,<iframe src="${baseURL}/s/${K}" width="800" height="600"></iframe>`);
  const framed = () => page.frames().find((f) => f !== page.mainFrame());
  // Chromium replaces a frame refused by frame-ancestors / X-Frame-Options with its error page
  await expect.poll(() => framed()?.url()).toMatch(/^chrome-error:/);
  expect(await framed()?.content()).not.toContain("Kestrel Bank Works");
});
