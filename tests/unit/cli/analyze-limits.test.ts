import { spawnSync } from "node:child_process";
import path from "node:path";
import { describe, expect, it } from "vitest";

const tsx = path.resolve("node_modules/.bin/tsx");

function cli(args: string[]) {
  // No DATABASE_URL: the CLI judges against the seed files the database is seeded from.
  const env = { ...process.env };
  delete env.DATABASE_URL;
  return spawnSync(tsx, ["scripts/analyze.ts", ...args], { encoding: "utf8", env });
}

describe("npm run analyze -- FILE --limits KEY", () => {
  it("adds the compliance block to the JSON, judged against the named set", () => {
    // Demo PSU: 180 W rated, I3 ≈ 0.69 A. IEC 61000-3-2 Table 3 (Class D): 3.4 mA/W × 180 W = 0.612 A → h3 fails.
    const res = cli(["fixtures/demo/bench-b-desktop-psu.csv", "--json", "--limits", "iec-61000-3-2-class-d", "--rated-power", "180"]);
    expect(res.status).toBe(0);
    const out = JSON.parse(res.stdout) as { channels: unknown[]; compliance: { limitSet: { key: string }; verdict: string; rows: { order: number; limit: number; verdict: string }[] } };
    expect(out.channels.length).toBe(2);
    expect(out.compliance.limitSet.key).toBe("iec-61000-3-2-class-d");
    const h3 = out.compliance.rows.find((r) => r.order === 3)!;
    expect(h3.limit).toBeCloseTo(0.612, 6);
    expect(h3.verdict).toBe("fail");
    expect(out.compliance.verdict).toBe("fail");
  });

  it("prints a readable per-order verdict table without --json", () => {
    const res = cli(["fixtures/demo/bench-b-heater-controller.csv", "--limits", "iec-61000-3-2-class-a"]);
    expect(res.status).toBe(0);
    // IEC 61000-3-2 Table 1, Class A: h3 limit 2.30 A.
    expect(res.stdout).toMatch(/2\.3/);
    expect(res.stdout.toLowerCase()).toContain("pass");
  });

  it("judges an IEEE 519 PCC capture with Isc and IL, and refuses an unknown key on one line", () => {
    const ok = cli(["fixtures/demo/quillbrook-drives-before-filter.csv", "--json", "--limits", "ieee-519-2014-current", "--isc", "8200", "--il", "260", "--bus-voltage", "11000"]);
    expect(ok.status).toBe(0);
    const c = (JSON.parse(ok.stdout) as { compliance: { band: { label: string }; rows: { order: number; limit: number }[] } }).compliance;
    // IEEE 519-2014 Table 2, 20 ≤ Isc/IL < 50 (8200/260 = 31.5): 7.0 % of IL for 3 ≤ h < 11.
    expect(c.band.label).toContain("20");
    expect(c.rows.find((r) => r.order === 5)!.limit).toBeCloseTo(7.0, 9);

    const bad = cli(["fixtures/demo/quillbrook-drives-before-filter.csv", "--limits", "no-such-set"]);
    expect(bad.status).toBe(1);
    expect(bad.stderr.trim().split("\n")).toHaveLength(1);
    expect(bad.stderr).toContain("unknown limit set");
    const stray = cli(["fixtures/demo/quillbrook-drives-before-filter.csv", "--isc", "8200"]);
    expect(stray.status).toBe(1);
    expect(stray.stderr).toContain("--limits");
  });
});
