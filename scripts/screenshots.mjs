// Takes full-page screenshots of running pages in headless Chromium, optionally signed in:
//   node scripts/screenshots.mjs [--base http://127.0.0.1:3000] [--as email:password] [--width 1280] path...
// Pictures go to .data/screenshots/. For looking at what a change did to a page.
import fs from "node:fs";
import path from "node:path";
import { chromium } from "@playwright/test";
import { CHROMIUM_LAUNCH } from "./chromium.mjs";

const args = process.argv.slice(2);
let base = "http://127.0.0.1:3000";
let as = null;
let width = 1280;
const paths = [];
for (let i = 0; i < args.length; i++) {
  if (args[i] === "--base") base = args[++i];
  else if (args[i] === "--as") as = args[++i];
  else if (args[i] === "--width") width = Number(args[++i]);
  else paths.push(args[i]);
}
const out = path.resolve(".data", "screenshots");
fs.mkdirSync(out, { recursive: true });
const browser = await chromium.launch(CHROMIUM_LAUNCH);
const page = await browser.newPage({ viewport: { width, height: 900 } });
if (as) {
  const [email, password] = as.split(":");
  await page.goto(`${base}/sign-in`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
}
for (const p of paths) {
  await page.goto(`${base}${p}`);
  await page.waitForLoadState("networkidle");
  const file = path.join(out, `${p.replace(/[^a-z0-9]+/gi, "_").replace(/^_|_$/g, "") || "home"}-${width}.png`);
  await page.screenshot({ path: file, fullPage: true });
  console.log(file);
}
await browser.close();
