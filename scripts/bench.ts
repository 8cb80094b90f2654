// Benchmarks of the analysis engine. Run: npm run bench [-- CASE_NAME] [--keep]
// Each case prepares its input (cached in the git-ignored bench/out/) and runs once, printing
// wall time, throughput, peak RSS and where the time goes. Add cases to BENCH_CASES.
// Inputs marked `large` (the 600 MB 10-minute record) are deleted after the run unless --keep is given.
import { spawn } from "node:child_process";
import { existsSync, mkdirSync, rmSync, statSync, writeFileSync } from "node:fs";
import { availableParallelism, loadavg } from "node:os";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { analyzeCsvFile } from "../lib/analysis/analyze-csv-file";
import type { StreamTimings } from "../lib/analysis/analyze-csv-file";
import { writeLines } from "../fixtures/write-lines";
import { analysisHelperWanted } from "./start-analysis-helper";

type StageTimings = StreamTimings;

const outDir = join(dirname(fileURLToPath(import.meta.url)), "..", "bench", "out");

interface BenchCase {
  name: string;
  description: string;
  /** Creates the input if missing; returns its path. */
  prepare: () => Promise<string>;
  /** `processRssMB`: peak RSS of a child process the case ran (replaces the bench's own sampled RSS). */
  run: (path: string) => Promise<{ timings: StageTimings; summary: string; processRssMB?: number; processCpuS?: number }>;
  targets: { wallS: number; rssMB: number };
  /** The input is large: delete it after the run unless --keep. */
  large?: boolean;
}

/**
 * Writes a 4-channel (Va, Ia, Vb, Ib) 25.6 kS/s capture of `seconds` with a time column.
 * `driftHz` swings the fundamental by ± that much around 50.03 Hz over a 10-minute period (grid drift).
 */
async function writeCapture(path: string, seconds: number, driftHz = 0): Promise<void> {
  mkdirSync(dirname(path), { recursive: true });
  const rate = 25_600;
  const f = 50.03;
  const rows = Math.round(seconds * rate);
  const w = 2 * Math.PI * f;
  const b = (-2 * Math.PI) / 3;
  const driftPeriodS = 600;
  await writeLines(path, "Time (s),Va (V),Ia (A),Vb (V),Ib (A)\n", rows, (k) => {
    const t = k / rate;
    // The fundamental's phase: ∫ 2π(f + drift·sin(2πt/P)) dt.
    const phase = driftHz === 0 ? w * t : w * t - driftHz * driftPeriodS * (Math.cos((2 * Math.PI * t) / driftPeriodS) - 1);
    const va = 325 * Math.cos(phase) + 8 * Math.cos(5 * phase + 0.2);
    const vb = 325 * Math.cos(phase + b) + 8 * Math.cos(5 * (phase + b) + 0.2);
    const ia = 14 * Math.cos(phase - 0.5) + 4 * Math.cos(3 * phase + 0.4) + 2.5 * Math.cos(5 * phase - 1) + 0.3 * Math.cos(37 * phase);
    const ib = 14 * Math.cos(phase + b - 0.5) + 4 * Math.cos(3 * (phase + b) + 0.4) + 2.5 * Math.cos(5 * (phase + b) - 1);
    return `${t.toFixed(7)},${va.toFixed(2)},${ia.toFixed(3)},${vb.toFixed(2)},${ib.toFixed(3)}\n`;
  });
}

/** The input bench/out/NAME, written by `write` when it is not there yet (inputs are cached between runs); resolves to its path. */
async function cachedInput(name: string, write: (path: string) => Promise<void> | void): Promise<string> {
  const path = join(outDir, name);
  if (!existsSync(path)) {
    mkdirSync(outDir, { recursive: true });
    await write(path);
  }
  return path;
}

/** The 60 s, 4-channel capture (60 MB) the engine, scanner and CLI cases read. */
const capture60s = () => cachedInput("capture-60s-4ch-25k6.csv", (path) => writeCapture(path, 60));

export const BENCH_CASES: BenchCase[] = [
  {
    name: "csv-60s-4ch-25k6",
    description: "60 s, 4 channels (Va, Ia, Vb, Ib), 25.6 kS/s, time column: CSV file → result via the streaming path",
    prepare: capture60s,
    run: async (path) => {
      const timings: StageTimings = {};
      const result = await analyzeCsvFile(path, {}, timings);
      const ia = result.channels.find((c) => c.name.startsWith("Ia"));
      return {
        timings,
        summary: `${result.window.count} windows × ${result.window.points} points, f = ${result.fundamentalHz.toFixed(4)} Hz, Ia THD ${ia?.thdPercent.toFixed(2)} %`,
      };
    },
    targets: { wallS: 3, rssMB: 500 },
  },
  {
    name: "csv-10min-4ch-25k6",
    description:
      "10 min, 4 channels (Va, Ia, Vb, Ib), 25.6 kS/s (15.4 M rows), fundamental drifting ±0.05 Hz: CSV file → result, two streaming passes, memory independent of length",
    prepare: () =>
      cachedInput("capture-10min-4ch-25k6.csv", async (path) => {
        const started = performance.now();
        await writeCapture(path, 600, 0.05);
        console.log(`  (generated ${path} in ${((performance.now() - started) / 1000).toFixed(1)} s)`);
      }),
    run: async (path) => {
      const timings: StageTimings = {};
      const result = await analyzeCsvFile(path, { includeOrderSeries: true, keepWaveformCycles: 3 }, timings);
      const ia = result.channels.find((c) => c.name.startsWith("Ia"));
      const series = ia?.series?.fundamentalRms ?? [];
      const spread = series.length ? Math.max(...series) - Math.min(...series) : 0;
      return {
        timings,
        summary: `${result.window.count} windows × ${result.window.points} points, f = ${result.fundamentalHz.toFixed(4)} Hz, Ia THD ${ia?.thdPercent.toFixed(2)} %, Ia fundamental spread over windows ${spread.toExponential(2)} A`,
      };
    },
    targets: { wallS: 30, rssMB: 800 },
    large: true,
  },
  {
    name: "interval-log-week-3ch",
    description: "a week of 10-minute values (1,008 rows), 3 current channels × orders 1–50 + THD + r.m.s.: import + IEEE 519 percentile evaluation",
    prepare: () =>
      cachedInput("interval-week-3ch-50.csv", (path) => {
        const channels = ["I1", "I2", "I3"];
        const headers = ["Timestamp", ...channels.flatMap((ch) => [...Array.from({ length: 50 }, (_, i) => `${ch} H${i + 1} avg [A]`), `${ch} THD avg [%]`, `${ch} rms avg [A]`])];
        const lines = [headers.join(",")];
        const start = Date.UTC(2024, 2, 4);
        for (let k = 0; k < 1008; k++) {
          const cells = [new Date(start + k * 600_000).toISOString()];
          for (let c = 0; c < channels.length; c++) {
            const i1 = 60 + 30 * Math.sin((2 * Math.PI * k) / 144) + c;
            const orders = Array.from({ length: 49 }, (_, i) => ((i + 2) % 2 === 1 ? i1 / (i + 2) : i1 / (20 * (i + 2))) * (0.9 + 0.2 * ((k * 7 + i) % 10) / 10));
            const distortion = Math.sqrt(orders.reduce((sum, v) => sum + v * v, 0));
            cells.push(i1.toFixed(3), ...orders.map((v) => v.toFixed(4)), ((distortion / i1) * 100).toFixed(3), Math.hypot(i1, distortion).toFixed(3));
          }
          lines.push(cells.join(","));
        }
        writeFileSync(path, `${lines.join("\n")}\n`);
      }),
    run: async (path) => {
      const { readFileSync } = await import("node:fs");
      const { inspectIntervalLog, importIntervalLog, evaluateIntervalLog } = await import("../lib/intervals");
      const { getSeedLimitSet } = await import("../lib/compliance/seed");
      const text = readFileSync(path, "utf8");
      const started = performance.now();
      const log = importIntervalLog(text, inspectIntervalLog(text).suggestion.mapping!);
      const importMs = performance.now() - started;
      const set = getSeedLimitSet("ieee-519-2014-current")!;
      const result = evaluateIntervalLog(log, { key: set.key, name: set.name, revision: { id: "bench", number: 1 }, content: set.content }, { iscA: 10_000, ilA: 100, busVoltageV: 480 });
      return {
        timings: { importMs },
        summary: `${log.timestampsMs.length} rows × ${log.channels.length} channels, verdict ${result.verdict}, evaluation ${(performance.now() - started - importMs).toFixed(0)} ms`,
      };
    },
    targets: { wallS: 2, rssMB: 500 },
  },
  diagnoseCase(),
];

/**
 * Writes an interval log: ISO timestamps every `intervalMs`, 3 current channels × (orders 1–50 avg,
 * THD avg, r.m.s. avg) — 156 value columns, ≈ 1.3 KB a row.
 */
async function writeIntervalLog(path: string, rows: number, intervalMs: number): Promise<void> {
  mkdirSync(dirname(path), { recursive: true });
  const channels = ["I1", "I2", "I3"];
  const header = `${["Timestamp", ...channels.flatMap((ch) => [...Array.from({ length: 50 }, (_, i) => `${ch} H${i + 1} avg [A]`), `${ch} THD avg [%]`, `${ch} rms avg [A]`])].join(",")}\n`;
  const start = Date.UTC(2024, 2, 4);
  await writeLines(path, header, rows, (k) => {
    const cells = [new Date(start + k * intervalMs).toISOString()];
    for (let c = 0; c < channels.length; c++) {
      const i1 = 60 + 30 * Math.sin((2 * Math.PI * k * intervalMs) / 86_400_000) + c;
      const orders = Array.from({ length: 49 }, (_, i) => ((i + 2) % 2 === 1 ? i1 / (i + 2) : i1 / (20 * (i + 2))) * (0.9 + (0.2 * ((k * 7 + i) % 10)) / 10));
      const distortion = Math.sqrt(orders.reduce((sum, v) => sum + v * v, 0));
      cells.push(i1.toFixed(3), ...orders.map((v) => v.toFixed(4)), ((distortion / i1) * 100).toFixed(3), Math.hypot(i1, distortion).toFixed(3));
    }
    return `${cells.join(",")}\n`;
  });
}

/** Interval logs as large as an upload may be: the worker's path, and the chart data it stores. */
function intervalCases(): BenchCase[] {
  return [
    {
      name: "interval-log-60mb",
      description: "37 days of 1-minute values (53,500 rows × 156 columns, ≈ 60 MB): the worker's judge of a stored log (read, import, IEEE 519 percentiles, trends)",
      prepare: () => cachedInput("interval-month-1min-3ch.csv", (path) => writeIntervalLog(path, 53_500, 60_000)),
      run: async (path) => {
        const { judgeBenchIntervalLog } = await import("./bench-interval-log");
        const started = performance.now();
        const { rows, verdict, trendPoints } = await judgeBenchIntervalLog(path);
        return { timings: { importMs: performance.now() - started }, summary: `${rows} rows, verdict ${verdict}, ${trendPoints} trend points stored per series` };
      },
      targets: { wallS: 20, rssMB: 350 },
    },
    {
      name: "scanner-vs-papaparse-60mb",
      description:
        "why waveform records keep their own scanner: the 60 s, 4-channel capture (60 MB) read into the same row collector by the fast scanner and by papaparse (the reader quoted files take)",
      prepare: capture60s,
      run: async (path) => {
        const { readCsvHead, readCsvRows } = await import("../lib/analysis/read-csv-rows");
        const { RowCollector } = await import("../lib/analysis/row-collector");
        const { planColumns } = await import("../lib/analysis/plan-columns");
        const { head, layout } = await readCsvHead(path);
        const sink = { accept: () => undefined };
        const timed = async (text: string): Promise<number> => {
          const started = performance.now();
          await readCsvRows(path, text, new RowCollector(layout, planColumns(layout, undefined), sink));
          return performance.now() - started;
        };
        const scannerMs = await timed(head);
        // A head with a quote sends readCsvRows down its papaparse path; the file and collector are the same.
        const papaparseMs = await timed(`${head}"`);
        return {
          timings: { importMs: scannerMs, rereadMs: papaparseMs },
          summary: `fast scanner ${(scannerMs / 1000).toFixed(2)} s, papaparse ${(papaparseMs / 1000).toFixed(2)} s: papaparse takes ${(papaparseMs / scannerMs).toFixed(1)}× as long`,
        };
      },
      targets: { wallS: 30, rssMB: 500 },
    },
  ];
}

/**
 * Runs a command as a child process and returns its peak RSS (getrusage of the child, reported by a
 * preloaded exit hook on fd 3) and its stdout.
 */
async function runChild(args: string[]): Promise<{ code: number; stdout: string; maxRssMB: number; cpuS: number }> {
  const hook = join(outDir, "report-rusage.cjs");
  writeFileSync(hook, 'process.on("exit", () => require("fs").writeSync(3, JSON.stringify(process.resourceUsage())));\n');
  const child = spawn(process.execPath, ["--require", hook, ...args], { stdio: ["ignore", "pipe", "inherit", "pipe"] });
  let stdout = "";
  let usage = "";
  child.stdout!.on("data", (d: Buffer) => (stdout += d.toString()));
  (child.stdio[3] as NodeJS.ReadableStream).on("data", (d: Buffer) => (usage += d.toString()));
  const code = await new Promise<number>((resolve) => child.on("close", (c) => resolve(c ?? 1)));
  const u = usage ? (JSON.parse(usage) as { maxRSS: number; userCPUTime: number; systemCPUTime: number }) : null;
  return { code, stdout, maxRssMB: u ? (u.maxRSS * 1024) / 1e6 : NaN, cpuS: u ? (u.userCPUTime + u.systemCPUTime) / 1e6 : NaN };
}

/** The command line as a whole process (start-up included): issue 9's target ≤ 1.2 s wall, ≤ 250 MB. */
function cliCases(): BenchCase[] {
  return [
    {
      name: "cli-60s-4ch-25k6",
      description: "the whole `npm run analyze -- FILE --json --limits iec-61000-3-2-class-a` process (node scripts/analyze.mjs, bundled) on the 60 s, 4-channel capture",
      prepare: async () => {
        const path = await capture60s();
        // Build the bundle now if stale, so its build time is not counted.
        const built = await runChild([join(dirname(fileURLToPath(import.meta.url)), "build-cli.mjs")]);
        if (built.code !== 0) throw new Error("building the CLI bundle failed");
        return path;
      },
      run: async (path) => {
        // The CLI's own rule for its helper thread, read just before it starts (the load can change in between).
        const forced = process.env.ORDWISE_ANALYSIS_HELPER === "on" || process.env.ORDWISE_ANALYSIS_HELPER === "off" ? ", set by ORDWISE_ANALYSIS_HELPER" : "";
        const helperNote = `helper thread ${analysisHelperWanted() ? "on" : "off"}${forced} (1-min load ${loadavg()[0]!.toFixed(1)} on ${availableParallelism()} cores)`;
        const started = performance.now();
        const res = await runChild([join(dirname(fileURLToPath(import.meta.url)), "analyze.mjs"), path, "--json", "--limits", "iec-61000-3-2-class-a"]);
        const wallMs = performance.now() - started;
        if (res.code !== 0) throw new Error(`the CLI exited with ${res.code}`);
        const out = JSON.parse(res.stdout) as { compliance: { verdict: string }; window: { count: number } };
        return {
          timings: {},
          summary: `CLI process ${(wallMs / 1000).toFixed(3)} s wall (target ≤ 1.2 s), peak RSS ${res.maxRssMB.toFixed(0)} MB (target ≤ 250 MB), CPU ${res.cpuS.toFixed(3)} s user+sys (wall exceeds CPU on a busy machine); ${helperNote}; ${out.window.count} windows, verdict ${out.compliance.verdict}`,
          processRssMB: res.maxRssMB,
          processCpuS: res.cpuS,
        };
      },
      targets: { wallS: 1.2, rssMB: 250 },
    },
  ];
}

/**
 * Front-end diagnosis: a 2 s three-phase capture of a six-pulse drive (simulated, 1 % line
 * reactance, 100 A) analysed, then diagnosed twice — the first run in a cold process (code not yet
 * optimised by the JIT), the second warm. Target < 1 s per channel.
 */
function diagnoseCase(): BenchCase {
  return {
    name: "diagnose-6pulse-3ch",
    description: "front-end diagnosis of a 3-phase six-pulse drive capture (orders 2–50, 9 families fitted per channel)",
    prepare: () =>
      cachedInput("drive-6pulse-2s.csv", async (path) => {
        const { simulateSixPulseCapacitorCycle } = await import("../lib/frontends/simulate-six-pulse-capacitor");
        const { currentA } = simulateSixPulseCapacitorCycle({ acInductancePercent: 1, dcChokePercent: 0, loadPercent: 100 });
        const n = currentA.length;
        const at = (x: number): number => {
          const u = ((x % 1) + 1) % 1 * n;
          const k = Math.floor(u);
          return currentA[k % n]! + (u - k) * (currentA[(k + 1) % n]! - currentA[k % n]!);
        };
        const rate = 12_800;
        const lines = ["Time (s),Va (V),Vb (V),Vc (V),Ia (A),Ib (A),Ic (A)"];
        for (let k = 0; k < 2 * rate; k++) {
          const c = (50 * k) / rate;
          const v = [0, -1 / 3, 1 / 3].map((s) => (325 * Math.cos(2 * Math.PI * (c + s))).toFixed(2));
          const i = [0, -1 / 3, 1 / 3].map((s) => (141 * at(c + s)).toFixed(3));
          lines.push([(k / rate).toFixed(7), ...v, ...i].join(","));
        }
        writeFileSync(path, `${lines.join("\n")}\n`);
      }),
    run: async (path) => {
      const { diagnoseChannels } = await import("../lib/frontends/diagnose-channels");
      const started = performance.now();
      const analysis = await analyzeCsvFile(path, {});
      const importMs = performance.now() - started;
      const t0 = performance.now();
      const cold = diagnoseChannels(analysis);
      const coldMs = performance.now() - t0;
      const t1 = performance.now();
      diagnoseChannels(analysis);
      const warmMs = performance.now() - t1;
      const n = cold.channels.length;
      const best = cold.channels[0]!.candidates[0]!;
      return {
        timings: { importMs },
        summary: `${n} current channels; cold ${(coldMs / n).toFixed(0)} ms per channel, warm ${(warmMs / n).toFixed(0)} ms per channel (target < 1000); best: ${best.family}, fit ${best.fitErrorPercent} %`,
      };
    },
    targets: { wallS: 6, rssMB: 500 },
  };
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const keep = args.includes("--keep");
  const only = args.find((a) => !a.startsWith("--"));
  let failed = false;
  for (const bench of [...BENCH_CASES, ...cliCases(), ...intervalCases()].filter((c) => !only || c.name === only)) {
    const path = await bench.prepare();
    const sizeMB = statSync(path).size / 1e6;
    let peakRss = process.memoryUsage().rss;
    const sampler = setInterval(() => {
      peakRss = Math.max(peakRss, process.memoryUsage().rss);
    }, 10);
    const started = performance.now();
    const cpuBefore = process.cpuUsage();
    const { timings, summary, processRssMB, processCpuS } = await bench.run(path);
    const wallS = (performance.now() - started) / 1000;
    const ownCpu = process.cpuUsage(cpuBefore);
    const cpuS = processCpuS ?? (ownCpu.user + ownCpu.system) / 1e6;
    clearInterval(sampler);
    peakRss = Math.max(peakRss, process.memoryUsage().rss);
    const rssMB = processRssMB ?? peakRss / 1e6;
    const ms = (v: number | undefined): string => `${((v ?? 0) / 1000).toFixed(3)} s`;
    const rest = wallS * 1000 - (timings.importMs ?? 0) - (timings.windowsMs ?? 0) - (timings.rereadMs ?? 0);
    console.log(`${bench.name}: ${bench.description}`);
    console.log(`  input        ${sizeMB.toFixed(1)} MB  (${summary})`);
    console.log(`  wall time    ${wallS.toFixed(3)} s   (${(sizeMB / wallS).toFixed(1)} MB/s of CSV)   target < ${bench.targets.wallS} s`);
    console.log(`  CPU          ${cpuS.toFixed(3)} s   user+sys (${processCpuS !== undefined ? "the child process" : "this process"}; steadier than wall time on a shared machine)`);
    console.log(`  peak RSS     ${rssMB.toFixed(0)} MB   target < ${bench.targets.rssMB} MB (${processRssMB !== undefined ? "the child process's getrusage maxrss" : "sampled every 10 ms"})`);
    if (Object.keys(timings).length === 0) {
      // A child process (the CLI case): its stages are not measured from here.
      console.log(`  stages       not measured (a separate process; its wall time, CPU and RSS are above)`);
    } else {
      console.log(`  parse/import ${ms(timings.importMs)}${timings.rereadMs !== undefined ? "   (pass 1: parse, checks, fundamental per segment and its phase per block)" : ""}`);
      if (timings.rereadMs !== undefined) console.log(`  pass 2 rows  ${ms(timings.rereadMs)}   (the kept rows replayed, or the file parsed again; time-axis and clipping checks, ring buffer)`);
      if (timings.windowsMs !== undefined) console.log(`  resample+FFT ${ms(timings.windowsMs)}   (windows: resampling, transforms, per-order values)`);
      console.log(
        `  rest         ${(rest / 1000).toFixed(3)} s   (checks ${ms(timings.checksMs)}, fundamental ${ms(timings.fundamentalMs)}${timings.rereadMs !== undefined ? " — inside pass 1" : ""}, aggregation ${ms(timings.aggregateMs)})`,
      );
    }
    console.log(`  process max  ${((process.resourceUsage().maxRSS * 1024) / 1e6).toFixed(0)} MB   (getrusage maxrss since the bench started, includes earlier cases)`);
    if (wallS > bench.targets.wallS || rssMB > bench.targets.rssMB) failed = true;
    if (bench.large && !keep) {
      rmSync(path, { force: true });
      console.log(`  deleted ${path} (pass --keep to keep it)`);
    }
  }
  if (failed) {
    console.log("some targets missed");
    process.exitCode = 1;
  }
}

await main();
