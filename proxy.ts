// Runs before every page and API route (Next.js "proxy", formerly middleware). Pages get a fresh script
// nonce and the Content-Security-Policy that names it; API requests for a method the route does not
// export get a JSON 405 naming the allowed ones. Other response headers are set in next.config.ts.
import { NextResponse, type NextRequest } from "next/server";
import { contentSecurityPolicy, securityHeaders } from "@/lib/api/security-headers";

/** `{ "/api/captures/[id]/review": ["POST"], … }`, written into the build by next.config.ts. */
const apiMethods: Record<string, string[]> = JSON.parse(process.env.ORDWISE_API_METHODS ?? "{}");
const apiPatterns = Object.entries(apiMethods).map(([route, methods]) => ({
  // A dynamic segment [x] matches one path segment.
  regex: new RegExp(`^${route.replace(/\[[^\]/]+\]/g, "[^/]+").replace(/[.]/g, "\\.")}/?$`),
  dynamicSegments: (route.match(/\[/g) ?? []).length,
  methods,
}));
// A static route (`/api/limit-sets/import`) wins over a dynamic one (`/api/limit-sets/[key]`), as in Next.js.
apiPatterns.sort((a, b) => a.dynamicSegments - b.dynamicSegments);

function allowedMethods(pathname: string): string[] | null {
  const hit = apiPatterns.find((p) => p.regex.test(pathname));
  if (!hit) return null;
  const allowed = new Set([...hit.methods, "OPTIONS"]);
  if (allowed.has("GET")) allowed.add("HEAD");
  return [...allowed].sort();
}

export function proxy(req: NextRequest): NextResponse {
  const { pathname } = req.nextUrl;
  if (pathname.startsWith("/api/")) {
    const allowed = allowedMethods(pathname);
    if (allowed && !allowed.includes(req.method)) {
      return NextResponse.json(
        { error: { code: "method_not_allowed", message: `${req.method} is not allowed here. Allowed: ${allowed.join(", ")}.` } },
        { status: 405, headers: { allow: allowed.join(", "), ...securityHeaders({ api: true }) } },
      );
    }
    return NextResponse.next();
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
    // Everything except built assets (they carry the headers of next.config.ts).
    "/((?!_next/static|_next/image|favicon.ico).*)",
  ],
};
