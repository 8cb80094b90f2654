import fs from "node:fs";
import http from "node:http";
import os from "node:os";

// Load benchmark of the sheet against the stack `npm start` already serves. Starts nothing.
// Run: npm run bench:web [-- --url http://127.0.0.1:3000] [--capture ID] [--clients 50] [--seconds 10]
//      [--case charts,sheet,json] [--path /any/page]
// Signs in as the demo engineer, picks an analysed capture (or --capture), and for each of
//   GET /api/captures/:id/charts?evaluation=…  (what the sheet's charts fetch)
//   GET /captures/:id                            (the sheet page, server-rendered, then the per-order part
//                                                 it loads: GET /api/captures/:id/sheet-body?evaluation=…,
//                                                 timed together, one after the other, as a browser waits)
//   GET /api/captures/:id                        (the capture JSON the progress poller reads)
// runs `clients` concurrent loops for `seconds`, then prints count, requests/s, errors and p50/p95/p99
// against the targets of the issue, with the response size as sent and the machine's load average (the
// machine may be shared; a number means little without it). `--case` runs only the named cases.
// Bounded: at most --max-requests per case (default 50 000), each request times out after 10 s,
// and only a loopback address is accepted.
// The load is generated on the same machine, so the client is kept cheap: node:http over one keep-alive
// connection per client (not fetch), the body counted but not decompressed (it asks for gzip like a browser,
// so the server still compresses). Each case prints the client's own CPU time, which the server did not get,
// and (on Linux) the CPU time the serving processes used per request — steadier than latency when
// other work shares the machine.

const args = process.argv.slice(2);
function arg(name: string, fallback: string): string {
  const i = args.indexOf(`--${name}`);
  return i >= 0 && args[i + 1] ? args[i + 1]! : fallback;
}

const base = new URL(arg("url", process.env.BENCH_URL ?? "http://127.0.0.1:3000"));
const clients = Math.min(200, Math.max(1, Number(arg("clients", "50"))));
const seconds = Math.min(60, Math.max(1, Number(arg("seconds", "10"))));
const maxRequests = Math.min(200_000, Math.max(1, Number(arg("max-requests", "50000"))));
const email = arg("email", "engineer@ordwise.test");
const password = arg("password", "ordwise-demo-2026");
// `--path /some/page` measures that GET as well (case "path", no target) — e.g. to find the floor of a bare route.
// Its answers count as answered for any status below 500: a floor may be a refusal (e.g. a 422 decided after
// the session is checked and before any query).
const extraPath = arg("path", "");
const caseNames = new Set(arg("case", extraPath ? "path" : "charts,sheet,json").split(",").map((c) => c.trim()));

const loopback = new Set(["127.0.0.1", "localhost", "[::1]", "::1"]);
if (!loopback.has(base.hostname)) {
  console.error(`bench:web runs against loopback only; ${base.hostname} is not (use --url http://127.0.0.1:PORT)`);
  process.exit(1);
}

async function signIn(): Promise<string> {
  const res = await fetch(new URL("/api/auth/sign-in", base), {
    method: "POST",
    headers: { "content-type": "application/json", origin: base.origin },
    body: JSON.stringify({ email, password }),
    signal: AbortSignal.timeout(10_000),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed with ${res.status}; is \`npm start\` running at ${base.origin}?`);
  const cookie = res.headers.getSetCookie().map((c) => c.split(";")[0]!).find((c) => c.startsWith("ordwise_session="));
  if (!cookie) throw new Error("sign-in set no session cookie");
  return cookie;
}

async function getJson<T>(path: string, cookie: string): Promise<T> {
  const res = await fetch(new URL(path, base), { headers: { cookie, accept: "application/json" }, signal: AbortSignal.timeout(10_000) });
  if (!res.ok) throw new Error(`GET ${path} → ${res.status}`);
  return (await res.json()) as T;
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))]!;
}

interface CaseResult {
  name: string;
  count: number;
  errors: number;
  perSecond: number;
  p50: number;
  p95: number;
  p99: number;
  targetP95Ms: number;
  bytes: number;
  clientCpuMs: number;
  /** CPU time of the serving processes during the case (NaN when they could not be found). */
  serverCpuMs: number;
  load: string;
}

/**
 * Linux: the processes serving `port` — those holding its listening socket, with their descendants (a
 * cluster's workers). Empty where /proc is not readable; the CPU column is then left out.
 */
function servingProcesses(port: number): number[] {
  try {
    const hex = port.toString(16).toUpperCase().padStart(4, "0");
    const inodes = new Set<string>();
    for (const table of ["/proc/net/tcp", "/proc/net/tcp6"]) {
      if (!fs.existsSync(table)) continue;
      for (const line of fs.readFileSync(table, "utf8").split("\n").slice(1)) {
        const f = line.trim().split(/\s+/);
        if (f[1]?.endsWith(`:${hex}`) && f[3] === "0A") inodes.add(f[9]!);
      }
    }
    const holders = fs.readdirSync("/proc").filter((d) => /^\d+$/.test(d)).filter((pid) => {
      try {
        return fs.readdirSync(`/proc/${pid}/fd`).some((fd) => {
          const m = /^socket:\[(\d+)\]$/.exec(fs.readlinkSync(`/proc/${pid}/fd/${fd}`));
          return m !== null && inodes.has(m[1]!);
        });
      } catch {
        return false;
      }
    });
    const all = new Set<number>();
    const walk = (pid: string) => {
      if (all.has(Number(pid))) return;
      all.add(Number(pid));
      for (const task of fs.readdirSync(`/proc/${pid}/task`)) {
        for (const child of fs.readFileSync(`/proc/${pid}/task/${task}/children`, "utf8").trim().split(/\s+/).filter(Boolean)) walk(child);
      }
    };
    holders.forEach(walk);
    return [...all];
  } catch {
    return [];
  }
}

/** User + system CPU time of the processes, in ms (clock ticks of 1/100 s, Linux's usual USER_HZ). */
function processCpuMs(pids: number[]): number {
  let ticks = 0;
  for (const pid of pids) {
    try {
      const stat = fs.readFileSync(`/proc/${pid}/stat`, "utf8");
      const f = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
      ticks += Number(f[11]) + Number(f[12]);
    } catch {
      // the process has ended
    }
  }
  return ticks * 10;
}

const loadAverage = () => os.loadavg().map((l) => l.toFixed(2)).join(" ");

const agent = new http.Agent({ keepAlive: true, maxSockets: clients, maxFreeSockets: clients });

/** One GET over the keep-alive agent: resolves with status and bytes on the wire; rejects after `timeoutMs` in all. */
function get(url: URL, cookie: string, timeoutMs = 10_000): Promise<{ status: number; bytes: number }> {
  return new Promise((resolve, reject) => {
    const req = http.request(url, { agent, headers: { cookie, "accept-encoding": "gzip, deflate, br" } }, (res) => {
      let bytes = 0;
      res.on("data", (chunk: Buffer) => (bytes += chunk.length));
      res.on("end", () => {
        clearTimeout(timer);
        resolve({ status: res.statusCode ?? 0, bytes });
      });
      res.on("error", reject);
    });
    const timer = setTimeout(() => req.destroy(new Error(`timed out after ${timeoutMs / 1000} s`)), timeoutMs);
    req.on("error", (err) => {
      clearTimeout(timer);
      reject(err);
    });
    req.end();
  });
}

async function runCase(name: string, path: string, cookie: string, targetP95Ms: number, follow?: string, okBelow = 300): Promise<CaseResult> {
  const url = new URL(path, base);
  const then = follow ? new URL(follow, base) : null;
  const latencies: number[] = [];
  let errors = 0;
  let started = 0;
  let bytes = 0;
  const cpu0 = process.cpuUsage();
  const server = servingProcesses(Number(url.port || 80));
  const serverCpu0 = processCpuMs(server);
  const deadline = performance.now() + seconds * 1000;
  const t0 = performance.now();
  const loop = async () => {
    while (performance.now() < deadline && started < maxRequests) {
      started += 1;
      const t = performance.now();
      try {
        const res = await get(url, cookie);
        const next = then && res.status >= 200 && res.status <= 299 ? await get(then, cookie) : null;
        bytes = res.bytes + (next?.bytes ?? 0);
        if (res.status < 200 || res.status >= okBelow || (next && (next.status < 200 || next.status > 299))) errors += 1;
        else latencies.push(performance.now() - t);
      } catch {
        errors += 1;
      }
    }
  };
  await Promise.all(Array.from({ length: clients }, loop));
  const elapsedS = (performance.now() - t0) / 1000;
  const cpu = process.cpuUsage(cpu0);
  const serverCpuMs = server.length > 0 ? processCpuMs(server) - serverCpu0 : Number.NaN;
  latencies.sort((a, b) => a - b);
  return {
    name,
    count: latencies.length,
    errors,
    perSecond: latencies.length / elapsedS,
    p50: percentile(latencies, 50),
    p95: percentile(latencies, 95),
    p99: percentile(latencies, 99),
    targetP95Ms,
    bytes,
    clientCpuMs: (cpu.user + cpu.system) / 1000,
    serverCpuMs,
    load: loadAverage(),
  };
}

const cookie = await signIn();
let captureId = arg("capture", "");
if (!captureId) {
  const list = await getJson<{ items: { id: string; status: string; kind?: string; title: string }[] }>("/api/captures?status=done", cookie);
  // The demo's three-phase drive capture is the heaviest sheet; fall back to any analysed one.
  captureId = (list.items.find((c) => c.title.startsWith("Compressor drives")) ?? list.items[0])?.id ?? "";
  if (!captureId) throw new Error("no analysed capture to load; seed the demo or pass --capture ID");
}
const { evaluations } = await getJson<{ evaluations: { id: string }[] }>(`/api/captures/${captureId}/evaluations`, cookie);
const evaluationId = evaluations[0]?.id;
console.log(`load average before: ${loadAverage()}`);
console.log(`bench:web ${base.origin} · capture ${captureId} · ${clients} clients × ${seconds} s per case (at most ${maxRequests} requests)`);

// The per-order part of the sheet that the page has the browser load (its address names the shown evaluation).
const sheetHtml = await (await fetch(new URL(`/captures/${captureId}`, base), { headers: { cookie }, signal: AbortSignal.timeout(10_000) })).text();
const sheetBody = new RegExp(`/api/captures/${captureId}/sheet-body\\?evaluation=[0-9a-f-]{36}`).exec(sheetHtml)?.[0];

const cases: Array<[string, string, string, number, string?]> = [
  ["charts", "GET /api/captures/:id/charts", `/api/captures/${captureId}/charts${evaluationId ? `?evaluation=${evaluationId}` : ""}`, 150],
  ["sheet", sheetBody ? "GET /captures/:id + its sheet-body" : "GET /captures/:id (sheet page)", `/captures/${captureId}`, 400, sheetBody],
  ["json", "GET /api/captures/:id", `/api/captures/${captureId}`, 100],
  ...(extraPath ? [["path", `GET ${extraPath}`, extraPath, Number.NaN] as [string, string, string, number]] : []),
];
const results: CaseResult[] = [];
for (const [key, name, path, target, follow] of cases) {
  if (!caseNames.has(key)) continue;
  // A short warm-up so first loads and caches are not measured: a few rounds of concurrent requests, so
  // that every serving process (they take connections in turn) has answered some.
  for (let round = 0; round < 3; round += 1) {
    await Promise.all(
      Array.from({ length: Math.min(clients, 8) }, () =>
        get(new URL(path, base), cookie, 30_000)
          .then(() => (follow ? get(new URL(follow, base), cookie, 30_000) : undefined))
          .catch(() => undefined),
      ),
    );
  }
  results.push(await runCase(name, path, cookie, target, follow, key === "path" ? 500 : 300));
}

const perRequest = (cpuMs: number, r: CaseResult) => `${(cpuMs / 1000).toFixed(2)} s (${(cpuMs / Math.max(1, r.count + r.errors)).toFixed(2)} ms/req)`;
const ms = (x: number) => (Number.isFinite(x) ? `${x.toFixed(1)} ms` : "—");
for (const r of results) {
  // Percentiles are of the answered requests; a run with failed or timed-out ones (10 s) is not within target.
  const verdict =
    r.count === 0 ? "NO DATA" : Number.isNaN(r.targetP95Ms) ? "no target" : r.p95 < r.targetP95Ms && r.errors === 0 ? "within target" : "OVER TARGET";
  console.log(
    `${r.name.padEnd(34)} n=${String(r.count).padStart(6)}  ${r.perSecond.toFixed(1).padStart(7)}/s  errors ${r.errors}  p50 ${ms(r.p50)}  p95 ${ms(r.p95)}  p99 ${ms(r.p99)}  (p95 target < ${r.targetP95Ms} ms: ${verdict})  ${(r.bytes / 1024).toFixed(1)} kB sent  client CPU ${perRequest(r.clientCpuMs, r)}${Number.isFinite(r.serverCpuMs) ? `  server CPU ${perRequest(r.serverCpuMs, r)}` : ""}  load ${r.load}`,
  );
}
agent.destroy();
process.exit(results.length === 0 || results.some((r) => r.count === 0) ? 1 : 0);
