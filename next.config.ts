import fs from "node:fs";
import path from "node:path";
import type { NextConfig } from "next";
import { securityHeaders } from "./lib/api/security-headers";

/** The methods each API route file exports, by route pattern, for the proxy's JSON 405 (read at build time). */
function apiRouteMethods(dir = path.join(process.cwd(), "app", "api")): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  const walk = (d: string) => {
    if (!fs.existsSync(d)) return;
    for (const e of fs.readdirSync(d, { withFileTypes: true })) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) walk(p);
      else if (e.name === "route.ts") {
        const src = fs.readFileSync(p, "utf8");
        const methods = [...src.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|HEAD|POST|PUT|PATCH|DELETE|OPTIONS)\b/g)].map((m) => m[1]!);
        out["/" + path.relative(path.join(process.cwd(), "app"), path.dirname(p)).split(path.sep).join("/")] = methods;
      }
    }
  };
  walk(dir);
  return out;
}

const asList = (h: Record<string, string>) => Object.entries(h).map(([key, value]) => ({ key, value }));

const nextConfig: NextConfig = {
  // `npm test` builds into a directory of its own so a test run never disturbs a running `npm start`
  // (or another test run) in the same checkout.
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
  // Native and Node-only packages stay outside the server bundle.
  serverExternalPackages: ["@node-rs/argon2", "pdfkit", "pg-boss"],
  // The proxy sees every request; no API body the app accepts is near this, and a larger one is cut here
  // (the route then refuses it as too large) instead of being buffered whole.
  experimental: { authInterrupts: true, proxyClientMaxBodySize: "1mb" },
  poweredByHeader: false,
  env: { ORDWISE_API_METHODS: JSON.stringify(apiRouteMethods()) },
  // Pages get their Content-Security-Policy (with a per-request nonce) from proxy.ts.
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
