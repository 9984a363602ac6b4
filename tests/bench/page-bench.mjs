// Page speed as a customer's phone sees it: Lighthouse 12 (its Node API) in Debian's Chromium,
// headless, against a running production server (`next build` + scripts/serve.mjs) with the demo
// data. Each page is measured under Lighthouse's default mobile profile (simulated slow 4G, 4×
// slower CPU, a phone's screen) and under its desktop profile; every figure printed is the median of
// RUNS runs, each in a fresh browser. Prints figures; never a pass/fail test. Lighthouse's own JSON
// of one mobile run per page is kept in .data/bench/ (its `script-treemap-data` audit is the
// treemap: which scripts each page loads and their sizes).
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import * as chromeLauncher from "chrome-launcher";
import lighthouse from "lighthouse";
import desktopConfig from "lighthouse/core/config/desktop-config.js";
import { CHROMIUM_LAUNCH } from "../../scripts/chromium.mjs";

const RUNS = 3;
const SHOP = "kestrel-bank-works";
const DEMO_PASSWORD = "faradsmith-demo-2026";
/** The goal under the mobile profile. */
const GOAL = { performance: 0.9, lcpMs: 2500, tbtMs: 200 };

// how every script starts Debian's Chromium, headless for Lighthouse
const CHROME_FLAGS = ["--headless=new", ...CHROMIUM_LAUNCH.args];

const median = (values) => {
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
};

/** One Lighthouse run in a fresh Chromium; the figures the table prints. */
async function measure(url, { desktop, cookie, keepAs }) {
  const chrome = await chromeLauncher.launch({ chromePath: CHROMIUM_LAUNCH.executablePath, chromeFlags: CHROME_FLAGS, logLevel: "silent" });
  try {
    const flags = {
      port: chrome.port,
      output: "json",
      logLevel: "error",
      onlyCategories: ["performance"],
      ...(cookie ? { extraHeaders: { Cookie: cookie } } : {}),
    };
    const result = await lighthouse(url, flags, desktop ? desktopConfig : undefined);
    const lhr = result?.lhr;
    if (!lhr) throw new Error(`Lighthouse returned nothing for ${url}`);
    if (lhr.runtimeError) throw new Error(`Lighthouse: ${lhr.runtimeError.code} ${lhr.runtimeError.message}`);
    if (keepAs) fs.writeFileSync(keepAs, JSON.stringify(lhr));
    const items = lhr.audits["resource-summary"]?.details?.items ?? [];
    const scriptBytes = items.find((i) => i.resourceType === "script")?.transferSize ?? 0;
    return {
      performance: lhr.categories.performance.score ?? 0,
      lcpMs: lhr.audits["largest-contentful-paint"].numericValue ?? 0,
      tbtMs: lhr.audits["total-blocking-time"].numericValue ?? 0,
      transferBytes: lhr.audits["total-byte-weight"].numericValue ?? 0,
      scriptBytes,
      cpuIndex: lhr.environment.benchmarkIndex ?? 0,
    };
  } finally {
    await chrome.kill();
  }
}

async function medianOf(url, options) {
  const runs = [];
  for (let i = 0; i < RUNS; i++) runs.push(await measure(url, { ...options, keepAs: i === 0 ? options.keepAs : undefined }));
  // each figure's own median
  return Object.fromEntries(Object.keys(runs[0]).map((key) => [key, median(runs.map((r) => r[key]))]));
}

/** A quote of the demo customer's, made through the real quoting path, and that customer's session cookie. */
async function customerQuote({ appUrl, root, env }) {
  const tsx = path.join(root, "node_modules", ".bin", "tsx");
  const made = spawnSync(tsx, ["--conditions=react-server", "tests/bench/bench-quote.ts"], { cwd: root, env, encoding: "utf8" });
  if (made.status !== 0) throw new Error(`making the bench quote failed:\n${made.stderr}`);
  const [email, number] = made.stdout.trim().split("\n").at(-1).split(" ");
  const res = await fetch(`${appUrl}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: appUrl },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  if (!res.ok) throw new Error(`signing in ${email} failed: ${res.status} ${await res.text()}`);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
  return { path: `/s/${SHOP}/quotes/${encodeURIComponent(number)}`, cookie };
}

const kib = (bytes) => `${(bytes / 1024).toFixed(0)} KiB`;
const sec = (ms) => `${(ms / 1000).toFixed(1)} s`;
const figures = (m) =>
  Number.isNaN(m.performance)
    ? ["—", "—", "—", "—", "—"]
    : [m.performance.toFixed(2), sec(m.lcpMs), `${m.tbtMs.toFixed(0)} ms`, kib(m.transferBytes), kib(m.scriptBytes)];

/**
 * @param {{ appUrl: string, root: string, env: Record<string, string | undefined>, desktop?: boolean }} options
 * `desktop: false` leaves the desktop column out (a quicker look while working on the mobile figures).
 */
export async function runPageBench({ appUrl, root, env, desktop: withDesktop = true }) {
  const keep = path.join(root, ".data", "bench");
  fs.mkdirSync(keep, { recursive: true });
  const quote = await customerQuote({ appUrl, root, env });
  const pages = [
    { name: "landing", path: "/" },
    { name: "storefront", path: `/s/${SHOP}` },
    { name: "quote", path: quote.path, cookie: quote.cookie, label: `/s/${SHOP}/quotes/<n> (customer)` },
  ];
  // one untimed visit each, so the figures are of a warm server
  for (const p of pages) await fetch(`${appUrl}${p.path}`, { headers: p.cookie ? { cookie: p.cookie } : {} });
  const load = () => os.loadavg()[0].toFixed(1);
  console.log(`Lighthouse 12.2.3 in headless Chromium, median of ${RUNS} runs each; machine load (1 min) at start ${load()} on ${os.cpus().length} cores`);
  const header = ["page", "mobile: perf", "LCP", "TBT", "transfer", "JS", "| desktop: perf", "LCP", "TBT", "transfer", "JS", "| mobile goal", "CPU index"];
  const rows = [header];
  for (const p of pages) {
    const mobile = await medianOf(`${appUrl}${p.path}`, { desktop: false, cookie: p.cookie, keepAs: path.join(keep, `lighthouse-${p.name}-mobile.json`) });
    const desktop = withDesktop
      ? await medianOf(`${appUrl}${p.path}`, { desktop: true, cookie: p.cookie })
      : { performance: Number.NaN, lcpMs: Number.NaN, tbtMs: Number.NaN, transferBytes: Number.NaN, scriptBytes: Number.NaN, cpuIndex: Number.NaN };
    const holds = mobile.performance >= GOAL.performance && mobile.lcpMs <= GOAL.lcpMs && mobile.tbtMs <= GOAL.tbtMs;
    rows.push([
      p.label ?? p.path,
      ...figures(mobile),
      `| ${figures(desktop)[0]}`,
      ...figures(desktop).slice(1),
      `| ${holds ? "holds" : "MISSED"}`,
      mobile.cpuIndex.toFixed(0),
    ]);
  }
  const widths = header.map((_, i) => Math.max(...rows.map((r) => r[i].length)));
  for (const r of rows) console.log(r.map((cell, i) => cell.padEnd(widths[i])).join("  "));
  console.log(
    `mobile goal: performance ≥ ${GOAL.performance}, LCP ≤ ${sec(GOAL.lcpMs)}, TBT ≤ ${GOAL.tbtMs} ms; machine load (1 min) at end ${load()}. ` +
      `Transfer is everything the page loads (compressed); JS its scripts. CPU index: Lighthouse's benchmark of this machine during the mobile runs ` +
      `(higher is faster; a loaded machine scores lower and its CPU figures, TBT above all, come out worse). Lighthouse JSON: ${path.relative(root, keep)}/`,
  );
}
