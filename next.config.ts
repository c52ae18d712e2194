import type { NextConfig } from "next";
import { STATIC_SECURITY_HEADERS } from "./lib/security-headers";

const nextConfig: NextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  serverExternalPackages: ["pg", "bcryptjs", "sharp", "@napi-rs/canvas", "pdfjs-dist", "jsdom", "dompurify", "file-type", "pg-boss"],
  experimental: {
    // forbidden() renders app/forbidden.tsx with a real 403 status.
    authInterrupts: true,
  },
  // Pages also get a per-request Content Security Policy from proxy.ts.
  async headers() {
    return [
      {
        source: "/:path*",
        headers: Object.entries(STATIC_SECURITY_HEADERS).map(([key, value]) => ({ key, value })),
      },
    ];
  },
};

export default nextConfig;
