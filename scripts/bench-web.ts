import os from "node:os";

// Load benchmark of the sheet against the stack `npm start` already serves. Starts nothing.
// Run: npm run bench:web [-- --url http://127.0.0.1:3000] [--capture ID] [--clients 50] [--seconds 10]
//      [--case charts,sheet,json]
// Signs in as the demo engineer, picks an analysed capture (or --capture), and for each of
//   GET /api/captures/:id/charts?evaluation=…  (what the sheet's charts fetch)
//   GET /captures/:id                            (the sheet page, server-rendered)
//   GET /api/captures/:id                        (the capture JSON the progress poller reads)
// runs `clients` concurrent loops for `seconds`, then prints count, requests/s, errors and p50/p95/p99
// against the targets of the issue, with the response size and the machine's load average (the
// machine may be shared; a number means little without it). `--case` runs only the named cases.
// Bounded: at most --max-requests per case (default 50 000), each request times out after 10 s,
// and only a loopback address is accepted.

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
const caseNames = new Set(arg("case", "charts,sheet,json").split(",").map((c) => c.trim()));

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
  load: string;
}

const loadAverage = () => os.loadavg().map((l) => l.toFixed(2)).join(" ");

async function runCase(name: string, path: string, cookie: string, targetP95Ms: number): Promise<CaseResult> {
  const url = new URL(path, base);
  const latencies: number[] = [];
  let errors = 0;
  let started = 0;
  let bytes = 0;
  const deadline = performance.now() + seconds * 1000;
  const t0 = performance.now();
  const loop = async () => {
    while (performance.now() < deadline && started < maxRequests) {
      started += 1;
      const t = performance.now();
      try {
        const res = await fetch(url, { headers: { cookie }, signal: AbortSignal.timeout(10_000) });
        bytes = (await res.arrayBuffer()).byteLength;
        if (!res.ok) errors += 1;
        else latencies.push(performance.now() - t);
      } catch {
        errors += 1;
      }
    }
  };
  await Promise.all(Array.from({ length: clients }, loop));
  const elapsedS = (performance.now() - t0) / 1000;
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

const cases: Array<[string, string, string, number]> = [
  ["charts", "GET /api/captures/:id/charts", `/api/captures/${captureId}/charts${evaluationId ? `?evaluation=${evaluationId}` : ""}`, 150],
  ["sheet", "GET /captures/:id (sheet page)", `/captures/${captureId}`, 400],
  ["json", "GET /api/captures/:id", `/api/captures/${captureId}`, 100],
];
const results: CaseResult[] = [];
for (const [key, name, path, target] of cases) {
  if (!caseNames.has(key)) continue;
  // A short warm-up so the first compile/cache fill is not measured.
  await fetch(new URL(path, base), { headers: { cookie }, signal: AbortSignal.timeout(30_000) }).then((r) => r.arrayBuffer()).catch(() => undefined);
  results.push(await runCase(name, path, cookie, target));
}

const ms = (x: number) => (Number.isFinite(x) ? `${x.toFixed(1)} ms` : "—");
for (const r of results) {
  // Percentiles are of the answered requests; a run with failed or timed-out ones (10 s) is not within target.
  const verdict = r.count === 0 ? "NO DATA" : r.p95 < r.targetP95Ms && r.errors === 0 ? "within target" : "OVER TARGET";
  console.log(
    `${r.name.padEnd(34)} n=${String(r.count).padStart(6)}  ${r.perSecond.toFixed(1).padStart(7)}/s  errors ${r.errors}  p50 ${ms(r.p50)}  p95 ${ms(r.p95)}  p99 ${ms(r.p99)}  (p95 target < ${r.targetP95Ms} ms: ${verdict})  ${(r.bytes / 1024).toFixed(1)} kB  load ${r.load}`,
  );
}
process.exit(results.length === 0 || results.some((r) => r.count === 0) ? 1 : 0);
