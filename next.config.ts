import type { NextConfig } from "next";
import { SECURITY_HEADERS } from "./lib/http/security-headers";

const nextConfig: NextConfig = {
  poweredByHeader: false,
  // parallel test runs build into folders of their own (scripts/test.mjs TEST_SLOT)
  distDir: process.env.NEXT_DIST_DIR || ".next",
  // `npm test` typechecks the whole project as its own step; the build need not do it again.
  typescript: { ignoreBuildErrors: true },
  serverExternalPackages: ["pg", "pg-boss", "nodemailer"],
  // on every response; the page Content-Security-Policy (with its nonce) is set in proxy.ts
  async headers() {
    return [{ source: "/:path*", headers: [...SECURITY_HEADERS] }];
  },
  experimental: {
    serverActions: { bodySizeLimit: "12mb" },
    authInterrupts: true,
  },
};

export default nextConfig;
