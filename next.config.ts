import type { NextConfig } from "next";
import { securityHeaders } from "./lib/api/security-headers.mjs";

const asList = (h: Record<string, string>) => Object.entries(h).map(([key, value]) => ({ key, value }));

const nextConfig: NextConfig = {
  // `npm test` builds into a directory of its own so a test run never disturbs a running `npm start`
  // (or another test run) in the same checkout.
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
  // Native and Node-only packages stay outside the server bundle.
  serverExternalPackages: ["@node-rs/argon2", "pdfkit", "pg-boss"],
  experimental: { authInterrupts: true },
  poweredByHeader: false,
  // scripts/serve.mjs compresses responses (at a lower level than Next.js's own).
  compress: false,
  // Pages get their Content-Security-Policy (with a per-request nonce) from scripts/serve.mjs.
  async headers() {
    return [
      { source: "/:path*", headers: asList(securityHeaders({ api: false })) },
      { source: "/api/:path*", headers: asList(securityHeaders({ api: true })) },
    ];
  },
  // `npm test` runs `tsc --noEmit` over the whole tree (tests and scripts included) before anything else,
  // so the production build does not type-check a second time.
  typescript: { ignoreBuildErrors: true },
};

export default nextConfig;
