import { defineConfig, devices } from "@playwright/test";
import { CHROMIUM_LAUNCH } from "./scripts/chromium.mjs";

const port = Number(process.env.APP_PORT ?? 3100);
const baseURL = `http://127.0.0.1:${port}`;

/** Browser tests in Debian's Chromium (no browser download) against `next start` with seeded data. */
export default defineConfig({
  testDir: "tests/e2e",
  outputDir: ".data/test-results/playwright",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  use: {
    baseURL,
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
    launchOptions: CHROMIUM_LAUNCH,
  },
  projects: [{ name: "chromium", use: { ...devices["Desktop Chrome"], channel: undefined } }],
  webServer: {
    // the production server that appends each connection's address to X-Forwarded-For
    command: `node scripts/serve.mjs -H 127.0.0.1 -p ${port}`,
    url: `${baseURL}/api/health`,
    reuseExistingServer: false,
    timeout: 120_000,
    stdout: "ignore",
    stderr: "pipe",
  },
});
