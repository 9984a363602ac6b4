// How every script and test starts Debian's Chromium (no browser is downloaded): headless, no GPU,
// no sandbox (runs as root in CI), and none of the background connections a closed network refuses.
export const CHROMIUM_LAUNCH = {
  executablePath: "/usr/bin/chromium",
  args: [
    "--no-sandbox",
    "--disable-gpu",
    "--disable-dev-shm-usage",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--no-first-run",
  ],
};
