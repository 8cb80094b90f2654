// The analyze CLI as a user runs it: a child process, JSON on stdout, one-line errors on stderr.
import { spawnSync } from "node:child_process";
import { describe, expect, test } from "vitest";
import { parseAnalyzeArgs, UsageError } from "@/scripts/analyze";

const run = (...args: string[]) => spawnSync("npx", ["tsx", "scripts/analyze.ts", ...args], { encoding: "utf8", timeout: 60_000 });

describe("npm run analyze", () => {
  test("--json prints exactly one JSON document in the design's shape", () => {
    const out = run("fixtures/three-phase-abc.csv", "--json", "--scale", "Ia=2", "--il", "20");
    expect(out.status).toBe(0);
    const result = JSON.parse(out.stdout);
    expect(Object.keys(result)).toEqual(expect.arrayContaining(["fundamentalHz", "nominalHz", "window", "channels", "power", "warnings"]));
    expect(result.window).toMatchObject({ cycles: 10, points: expect.any(Number), count: 1 });
    const ia = result.channels.find((c: { name: string }) => c.name === "Ia");
    expect(ia).toMatchObject({ quantity: "current", unit: "A", scale: 2, tddPercent: expect.any(Number) });
    expect(ia.harmonics[0]).toEqual(expect.objectContaining({ order: 1, rms: expect.any(Number), phaseDeg: expect.any(Number), percentOfFundamental: 100 }));
    expect(result.power.phases[0]).toEqual(
      expect.objectContaining({ voltage: "Va", current: "Ia", activePowerW: expect.any(Number), displacementFactor: expect.any(Number) }),
    );
  }, 60_000);

  test("the table lists orders, rms, % of fundamental and phase, and the indices", () => {
    const out = run("fixtures/single-phase-50hz.csv", "--max-order", "13");
    expect(out.status).toBe(0);
    expect(out.stdout).toMatch(/order\s+rms A\s+% of h1\s+phase °/);
    expect(out.stdout).toMatch(/THD\(h≤40\)/);
    expect(out.stdout).toMatch(/K-factor/);
    expect(out.stdout).toMatch(/^\s+13\s/m);
    expect(out.stdout).not.toMatch(/^\s+14\s/m);
  }, 60_000);

  test("a bad file exits 1 with a one-line message and no stack trace", () => {
    const out = run("fixtures/error-non-numeric.csv", "--json");
    expect(out.status).toBe(1);
    expect(out.stdout).toBe("");
    expect(out.stderr.trim().split("\n")).toHaveLength(1);
    expect(out.stderr).toMatch(/^error: non-numeric cell at line 57, column 3/);
    expect(out.stderr).not.toMatch(/\bat .*\.ts:\d+/);
  }, 60_000);
});

describe("parseAnalyzeArgs", () => {
  test("maps flags to options", () => {
    const args = parseAnalyzeArgs(["cap.csv", "--frequency", "60", "--interval", "1e-4", "--channel", "CH1=current", "--scale", "CH1=40", "--thd-order", "50"]);
    expect(args).toMatchObject({ file: "cap.csv", json: false, options: { frequencyHz: 60, sampleIntervalS: 1e-4, thdMaxOrder: 50, channels: { CH1: { quantity: "current", scale: 40 } } } });
  });
  test.each([[["--json"]], [["a.csv", "--frequency", "55"]], [["a.csv", "--scale", "Ia"]], [["a.csv", "--bogus"]]])("rejects %j", (argv) => {
    expect(() => parseAnalyzeArgs(argv)).toThrow(UsageError);
  });
});
