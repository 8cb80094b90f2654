#!/usr/bin/env node
// Serves the production build (`next build`) with WEB_PROCESSES Next.js processes: with more than one, a
// `node:cluster` primary owns the listening socket and hands connections round-robin to the workers, each
// running Next.js through its programmatic API — the same request pipeline `next start` runs. `npm start`,
// `npm test` and `npm run dev` serve through this file.
//
//   PORT (3000), HOST (127.0.0.1), WEB_PROCESSES (default: one per core, at most four)
//   --dev: the development server (`npm run dev`), one process.
//
// On the 2-core machine the targets are measured on, two processes answered ~35–50 % more requests than one
// while the machine was otherwise idle, and none more while other work kept both cores busy (DEVELOPERS.md,
// Serving). At most four: each process holds up to 10 PostgreSQL connections, and PostgreSQL allows 100.
//
// Nothing the app keeps per process may matter across requests: sessions, sign-in throttling and the job
// queue live in PostgreSQL, so any worker can answer any request.
//
// Before Next.js sees a request, this server gives a page a fresh script nonce and the Content-Security-
// Policy naming it (Next.js reads the nonce from the request's policy and puts it on its scripts), and answers
// an API request for a method its route file does not export with a JSON 405 and `Allow`. Done in a Next.js
// proxy (middleware) instead, that step cost ~3 ms of CPU per request: a quarter of a small API route's, ~4 ms
// of an empty signed-in page's ~20.

import cluster from "node:cluster";
import fs from "node:fs";
import http from "node:http";
import { randomBytes } from "node:crypto";
import { createRequire } from "node:module";
import os from "node:os";
import { Duplex } from "node:stream";
import path from "node:path";
import { fileURLToPath } from "node:url";
import next from "next";
import { contentSecurityPolicy, securityHeaders } from "../lib/api/security-headers.mjs";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const port = Number(process.env.PORT ?? 3000);
const hostname = process.env.HOST ?? "127.0.0.1";
const dev = process.argv.includes("--dev");
const requested = Number(process.env.WEB_PROCESSES);
const processes = dev ? 1 : Number.isInteger(requested) && requested > 0 ? requested : Math.min(4, os.availableParallelism());
// A worker that dies within this long of starting is not restarted (it would only die again).
const minUptimeMs = 10_000;

/** `{ "/api/captures/[id]/review": ["POST"], … }`: the methods each route file under app/api exports. */
function apiRouteMethods(dir = path.join(root, "app", "api")) {
  const out = {};
  const walk = (d) => {
    if (!fs.existsSync(d)) return;
    for (const e of fs.readdirSync(d, { withFileTypes: true })) {
      const p = path.join(d, e.name);
      if (e.isDirectory()) walk(p);
      else if (e.name === "route.ts") {
        const src = fs.readFileSync(p, "utf8");
        const methods = [...src.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|HEAD|POST|PUT|PATCH|DELETE|OPTIONS)\b/g)].map((m) => m[1]);
        out["/" + path.relative(path.join(root, "app"), path.dirname(p)).split(path.sep).join("/")] = methods;
      }
    }
  };
  walk(dir);
  return out;
}

/** The methods the route serving `pathname` allows (HEAD with GET, OPTIONS always), or null if no route file matches. */
function allowedMethodsFinder() {
  const patterns = Object.entries(apiRouteMethods()).map(([route, methods]) => {
    const allowed = new Set([...methods, "OPTIONS"]);
    if (allowed.has("GET")) allowed.add("HEAD");
    return {
      // A dynamic segment [x] matches one path segment.
      regex: new RegExp(`^${route.replace(/\[[^\]/]+\]/g, "[^/]+").replace(/[.]/g, "\\.")}/?$`),
      dynamicSegments: (route.match(/\[/g) ?? []).length,
      allowed: [...allowed].sort(),
    };
  });
  // A static route (`/api/limit-sets/import`) wins over a dynamic one (`/api/limit-sets/[key]`), as in Next.js.
  patterns.sort((a, b) => a.dynamicSegments - b.dynamicSegments);
  return (pathname) => patterns.find((p) => p.regex.test(pathname))?.allowed ?? null;
}

/**
 * Response compression: the `compression` middleware Next.js bundles (its own is off in next.config.ts), at
 * gzip level 1 instead of zlib's default 6. For the demo's heaviest sheet page (327 kB of HTML) level 6 took
 * ~3.1 ms and level 1 ~1.2 ms (medians of 200), for 32 kB instead of 26 kB; for its chart data (62 kB) 2.2
 * and 1.3 ms, for 22 kB instead of 21 kB. Level 1 is also nginx's default for gzip.
 */
function compressor() {
  const compression = createRequire(import.meta.url)("next/dist/compiled/compression");
  const middleware = compression({ level: 1 });
  const noop = () => {};
  return (req, res) => {
    middleware(req, res, noop);
    // As Next.js does: a client that leaves mid-response would otherwise leave the zlib stream open.
    res.once("close", () => {
      if (res.writableFinished) return;
      const stream = res.on("drain", noop);
      res.off("drain", noop);
      if (stream !== res && stream instanceof Duplex) stream.destroy();
    });
  };
}

/**
 * Next.js writes an API answer as headers, then each chunk followed by a flush. For an API answer this holds
 * the headers and the first chunk until the next chunk or the end, so a whole answer goes out in one piece
 * with its length: one socket write instead of three, and one below 1 kB is not compressed (the compression
 * middleware can apply its threshold only to a length it knows). Longer answers (exports) stream from their
 * second chunk on. Compressing an 11-byte answer took ~9 % of a minimal signed-in route's CPU time.
 * Call after the compression middleware so that it sees the whole first piece.
 */
function holdFirstChunk(res) {
  const { write, end } = res;
  const flush = res.flush;
  let held = null;
  let done = false;
  const release = () => {
    if (held === null) return;
    const chunk = held;
    held = null;
    write.call(res, chunk);
  };
  res.flushHeaders = () => undefined;
  res.flush = () => {
    if (held === null) flush?.call(res);
  };
  res.write = (chunk, encoding, callback) => {
    if (!done && !res.headersSent && held === null && typeof encoding !== "function" && callback === undefined) {
      done = true;
      held = typeof chunk === "string" ? Buffer.from(chunk, encoding) : chunk;
      return true;
    }
    release();
    return write.call(res, chunk, encoding, callback);
  };
  res.end = (chunk, encoding, callback) => {
    if (held === null) return end.call(res, chunk, encoding, callback);
    if (typeof chunk === "function") [callback, chunk] = [chunk, undefined];
    else if (typeof encoding === "function") [callback, encoding] = [encoding, undefined];
    const whole = chunk == null ? held : Buffer.concat([held, typeof chunk === "string" ? Buffer.from(chunk, encoding ?? "utf8") : chunk]);
    held = null;
    // The middleware drops the length when it compresses.
    if (!res.headersSent) res.setHeader("content-length", whole.length);
    return end.call(res, whole, callback);
  };
}

/**
 * Next.js drops Content-Encoding from a route handler's answer (it cannot tell whether a fetched body it
 * forwards was decoded on the way). A route that answers with bytes already encoded — the charts route
 * sends chart data gzipped as stored — names the encoding in this header instead, and this server sends it
 * as Content-Encoding; the compression middleware then leaves the body alone.
 */
const encodedHeader = "x-content-encoding";
function passEncoding(res) {
  const { appendHeader, setHeader } = res;
  const pass = (original) =>
    function (name, value) {
      if (typeof name === "string" && name.toLowerCase() === encodedHeader) return setHeader.call(res, "content-encoding", value);
      return original.call(res, name, value);
    };
  res.appendHeader = pass(appendHeader);
  res.setHeader = pass(setHeader);
}

// Built assets carry the headers of next.config.ts and no page policy.
const builtAsset = /^\/(?:_next\/static\/|_next\/image|favicon\.ico)/;

/** The JSON 405 for a method the route file does not export, naming the allowed ones. */
function methodNotAllowed(req, res, allowed) {
  const body = JSON.stringify({ error: { code: "method_not_allowed", message: `${req.method} is not allowed here. Allowed: ${allowed.join(", ")}.` } });
  res.writeHead(405, {
    ...securityHeaders({ api: true }),
    allow: allowed.join(", "),
    "content-type": "application/json",
    "content-length": Buffer.byteLength(body),
  });
  res.end(body);
}

if (cluster.isPrimary && processes > 1) {
  process.title = "ordwise-web";
  let stopping = false;
  const startedAt = new Map();
  const fork = () => startedAt.set(cluster.fork().id, Date.now());
  for (let i = 0; i < processes; i += 1) fork();
  cluster.on("exit", (worker, code, signal) => {
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      return;
    }
    const upMs = Date.now() - (startedAt.get(worker.id) ?? 0);
    process.stderr.write(`[ordwise] web process ${worker.process.pid} stopped (${signal ?? code}) after ${Math.round(upMs / 1000)} s\n`);
    if (upMs < minUptimeMs) process.exit(1);
    fork();
  });
  const stop = () => {
    stopping = true;
    for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill("SIGTERM");
    setTimeout(() => process.exit(0), 10_000).unref();
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
  cluster.once("listening", () => {
    process.stdout.write(`[ordwise] web app: ${processes} Next.js processes on http://${hostname}:${port}\n`);
  });
} else {
  process.title = processes > 1 ? "ordwise-web-worker" : "ordwise-web";
  const app = next({ dev, dir: root, hostname, port });
  await app.prepare();
  const handle = app.getRequestHandler();
  const allowedMethods = allowedMethodsFinder();
  const compress = compressor();
  const server = http.createServer((req, res) => {
    const pathname = (req.url ?? "/").split("?")[0];
    if (pathname.startsWith("/api/")) {
      const allowed = allowedMethods(pathname);
      if (allowed && !allowed.includes(req.method ?? "")) return methodNotAllowed(req, res, allowed);
    } else if (!builtAsset.test(pathname)) {
      const csp = contentSecurityPolicy({ nonce: randomBytes(16).toString("base64") });
      req.headers["content-security-policy"] = csp;
      res.setHeader("content-security-policy", csp);
    }
    if (pathname.startsWith("/api/")) passEncoding(res);
    compress(req, res);
    if (pathname.startsWith("/api/")) holdFirstChunk(res);
    handle(req, res).catch((err) => {
      console.error(`[ordwise] failed to answer ${req.method} ${req.url}:`, err);
      if (!res.headersSent) res.statusCode = 500;
      res.end();
    });
  });
  server.listen(port, hostname);
  // Finish what is in flight, then leave; idle keep-alive connections do not hold the process.
  const stop = () => {
    server.close(() => process.exit(0));
    server.closeIdleConnections();
    setTimeout(() => process.exit(0), 5_000).unref();
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
  if (processes === 1) server.once("listening", () => process.stdout.write(`[ordwise] web app on http://${hostname}:${port}\n`));
}
