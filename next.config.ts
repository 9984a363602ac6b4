import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  poweredByHeader: false,
  serverExternalPackages: ["pg", "pg-boss", "nodemailer"],
  experimental: {
    serverActions: { bodySizeLimit: "12mb" },
    authInterrupts: true,
  },
};

export default nextConfig;
