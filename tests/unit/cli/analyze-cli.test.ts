// The analysis command line as a user runs it: a child process, JSON or tables on stdout,
// one-line errors on stderr, the worker's pipeline underneath.
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { classABurst, writeClassABurst } from "@/fixtures/burst/class-a-burst";
import { ANALYZE_FLAGS } from "@/lib/pipeline/parse-analyze-args";
import { runAnalyzeCli } from "@/tests/support/run-analyze-cli";

const slow = 120_000;
let dir: string;
let burst: string;

beforeAll(async () => {
  dir = mkdtempSync(path.join(os.tmpdir(), "ordwise-cli-"));
  burst = path.join(dir, "class-a-burst.csv");
  await writeClassABurst(burst);
}, slow);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

interface Row {
  order: number;
  verdict: string;
  decidedBy?: string;
  measured: number | null;
  limit: number | null;
}
interface Out {
  file: string;
  channels: { name: string; scale?: number; fundamentalRms: number; tddPercent?: number; thdMaxOrder: number; harmonics: { order: number; rms: number }[] }[];
  compliance: { verdict: string; rows: Row[]; band: { label: string; reason: string }; context: Record<string, unknown> };
  limitSetSource: string;
}

describe("npm run analyze -- FILE --limits KEY", () => {
  test("a Class A capture whose h3 bursts for 3 s fails on the 150 % rule, as in the app, though its capture mean is under the limit", () => {
    const res = runAnalyzeCli([burst, "--json", "--limits", "iec-61000-3-2-class-a"]);
    expect(res.stderr).toBe("");
    expect(res.status).toBe(0);
    const out = JSON.parse(res.stdout) as Out;
    expect(out.limitSetSource).toBe("seed-files");
    const h3 = out.compliance.rows.find((r) => r.order === 3)!;
    // IEC 61000-3-2:2018+A1:2020 Table 1 (Class A): h3 2.30 A; clause 6.2: smoothed values may reach 150 % → 3.45 A (150 % from memory).
    // Independent expectation (IEC 61000-4-7:2002+A1:2008 §5.5.1, first-order smoothing with a 1.5 s time
    // constant): after 3 s at 4.0 A from 1.5 A the smoothed h3 is 1.5 + 2.5 × (1 − e^(−3/1.5)) = 3.662 A.
    const smoothedPeak = classABurst.h3A + (classABurst.h3BurstA - classABurst.h3A) * (1 - Math.exp(-3 / 1.5));
    expect(h3).toMatchObject({ verdict: "fail", decidedBy: "smoothed-max" });
    expect(h3.measured).toBeCloseTo(smoothedPeak, 2);
    expect(h3.limit).toBeCloseTo(3.45, 9);
    // The capture mean, which the old command line compared, is under 2.30 A: analytic, 37 s at 1.5 A and
    // 3 s at 4.0 A of the 40 s record give √((37 × 1.5² + 3 × 4.0²)/40) = 1.81 A.
    const h3Mean = out.channels.find((c) => c.name === "I (A)")!.harmonics.find((h) => h.order === 3)!.rms;
    expect(h3Mean).toBeCloseTo(Math.sqrt((37 * 1.5 ** 2 + 3 * 4.0 ** 2) / 40), 3);
    expect(h3Mean).toBeLessThan(2.3);
    expect(out.compliance.verdict).toBe("fail");
    // THD up to order 50 as the worker computes it (the old command line used 40).
    expect(out.channels.find((c) => c.name === "I (A)")!.thdMaxOrder).toBe(50);
  }, slow);

  test("readable output says the limit set came from the seed files", () => {
    const res = runAnalyzeCli(["fixtures/demo/bench-b-heater-controller.csv", "--limits", "iec-61000-3-2-class-a"]);
    expect(res.status).toBe(0);
    expect(res.stdout).toContain('limit set iec-61000-3-2-class-a "');
    expect(res.stdout).toContain("from the seed files");
  }, slow);

  test("--nominal-voltage 11000 chooses the IEEE 519 table when --bus-voltage is not given", () => {
    const res = runAnalyzeCli(["fixtures/demo/quillbrook-drives-before-filter.csv", "--json", "--limits", "ieee-519-2014-current", "--isc", "8200", "--il", "260", "--nominal-voltage", "11000"]);
    expect(res.status).toBe(0);
    const c = (JSON.parse(res.stdout) as Out).compliance;
    // IEEE Std 519-2014 Table 2 (120 V to 69 kV), 20 ≤ Isc/IL < 50 (8200/260 = 31.5): 7.0 % of IL for 3 ≤ h < 11.
    expect(c.band.reason).toContain("bus voltage = 11000 V");
    expect(c.rows.find((r) => r.order === 5)!.limit).toBeCloseTo(7.0, 9);
    expect(c.context).toMatchObject({ busVoltageV: 11000, busVoltageSource: "system-nominal", nominalVoltageV: 6351 });
  }, slow);

  test("several files: one JSON document per line, one per file, in order; a column the file lacks is refused, listing its columns", () => {
    const res = runAnalyzeCli(["fixtures/three-phase-abc.csv", "fixtures/single-phase-50hz.csv", "--json", "--scale", "Ia=2", "--il", "20"]);
    const lines = res.stdout.trim().split("\n");
    expect(lines).toHaveLength(2);
    const [a, b] = lines.map((l) => JSON.parse(l) as Out & { error?: string });
    expect(a!.file).toBe("fixtures/three-phase-abc.csv");
    // fixtures/generate.ts writes Ia as a finite Fourier series: 14.1 A peak fundamental and 4.2, 2.8,
    // 1.4, 0.6 A peak at orders 3, 5, 7, 11 (plus 0.01 A noise). Scaled ×2 (analytic Fourier series):
    // I1 = 2·14.1/√2 = 19.94 A; TDD = 2·√((4.2² + 2.8² + 1.4² + 0.6²)/2) / 20 A = 7.457/20 = 37.28 %
    // (TDD as defined in IEEE Std 519-2014 §3.1, IL given by --il).
    const ia = a!.channels.find((c) => c.name === "Ia")!;
    expect(ia.fundamentalRms).toBeCloseTo(19.94, 1);
    expect(ia.tddPercent!).toBeCloseTo(37.28, 1);
    // --scale names Ia, which the second file does not have.
    expect(b).toMatchObject({ file: "fixtures/single-phase-50hz.csv", error: expect.stringContaining('"Ia"') });
    expect(res.stderr).toContain("the file's columns are: Time (s), V (V), I (A)");
    expect(res.status).toBe(1);
  }, slow);

  test("a bad file exits 1 with a one-line message and no stack trace", () => {
    const res = runAnalyzeCli(["fixtures/error-non-numeric.csv"]);
    expect(res.status).toBe(1);
    expect(res.stdout).toBe("");
    expect(res.stderr.trim().split("\n")).toHaveLength(1);
    expect(res.stderr).toMatch(/^error: fixtures\/error-non-numeric.csv: non-numeric cell at line 57, column 3/);
    expect(res.stderr).not.toMatch(/\bat .*\.ts:\d+/);
  }, slow);

  test("--help lists every flag with its unit, and README and DEVELOPERS.md list the same flags", () => {
    const res = runAnalyzeCli(["--help"]);
    expect(res.status).toBe(0);
    const readme = readFileSync("README.md", "utf8");
    // A pipe inside a Markdown table cell is written \| (GitHub Flavored Markdown spec, section 4.10 "Tables").
    const developers = readFileSync("DEVELOPERS.md", "utf8").replaceAll("\\|", "|");
    for (const { flag, value } of ANALYZE_FLAGS) {
      const shown = `${flag} ${value}`.trimEnd();
      expect(res.stdout).toContain(shown);
      expect(readme, `README.md lists ${shown}`).toContain(shown);
      expect(developers, `DEVELOPERS.md lists ${shown}`).toContain(shown);
    }
  }, slow);
});
