import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // `npm test` builds into a directory of its own so a test run never disturbs a running `npm start`
  // (or another test run) in the same checkout.
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
  // Native and Node-only packages stay outside the server bundle.
  serverExternalPackages: ["@node-rs/argon2", "pdfkit", "s3rver", "smtp-server", "mailparser", "pg-boss"],
  experimental: { authInterrupts: true },
  poweredByHeader: false,
  // `npm test` runs `tsc --noEmit` over the whole tree (tests and scripts included) before anything else,
  // so the production build does not type-check a second time.
  typescript: { ignoreBuildErrors: true },
};

export default nextConfig;
