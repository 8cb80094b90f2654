// Runs before every page (Next.js "proxy", formerly middleware): a fresh script nonce and the
// Content-Security-Policy that names it. API requests skip it, except those scripts/serve.mjs flagged with
// `x-ordwise-allow` (their route file does not export the method): they get a JSON 405 naming the allowed
// methods. Other response headers are set in next.config.ts.
import { NextResponse, type NextRequest } from "next/server";
import { contentSecurityPolicy, securityHeaders } from "@/lib/api/security-headers";

export function proxy(req: NextRequest): NextResponse {
  const { pathname } = req.nextUrl;
  if (pathname.startsWith("/api/")) {
    const allowed = req.headers.get("x-ordwise-allow");
    if (allowed === null) return NextResponse.next();
    return NextResponse.json(
      { error: { code: "method_not_allowed", message: `${req.method} is not allowed here. Allowed: ${allowed}.` } },
      { status: 405, headers: { allow: allowed, ...securityHeaders({ api: true }) } },
    );
  }
  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
  const csp = contentSecurityPolicy({ nonce });
  // Next.js reads the nonce from the request's policy and puts it on its own scripts.
  const requestHeaders = new Headers(req.headers);
  requestHeaders.set("content-security-policy", csp);
  requestHeaders.set("x-nonce", nonce);
  const res = NextResponse.next({ request: { headers: requestHeaders } });
  res.headers.set("content-security-policy", csp);
  return res;
}

export const config = {
  matcher: [
    // Every page; not built assets (they carry the headers of next.config.ts) nor API routes.
    "/((?!api/|_next/static|_next/image|favicon.ico).*)",
    // API requests for a method their route does not export (flagged by scripts/serve.mjs).
    { source: "/api/:path*", has: [{ type: "header", key: "x-ordwise-allow" }] },
  ],
};
