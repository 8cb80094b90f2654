// npm run analyze -- FILE --json --diagnose / --mitigate SPEC (the exact contract of the CLI).
import { describe, expect, it } from "vitest";
import { runAnalyzeCli } from "@/tests/support/run-analyze-cli";

const file = "fixtures/demo/quillbrook-drives-before-filter.csv";
const cli = (args: string[]) => runAnalyzeCli(args, { timeoutMs: 120_000 });

describe("npm run analyze -- FILE --diagnose --mitigate SPEC", () => {
  it("adds diagnosis and whatIf, with the predicted compliance judged like the measured one", () => {
    const res = cli([file, "--json", "--thd-order", "50", "--diagnose", "--mitigate", "reactor=5%", "--mitigate", "filter=4.7@3000kvar,q=30", "--limits", "ieee-519-2014-current", "--isc", "8200", "--il", "260", "--bus-voltage", "11000"]);
    expect(res.stderr).toBe("");
    expect(res.status).toBe(0);
    const out = JSON.parse(res.stdout) as {
      compliance: { limitSet: { key: string }; revision: { number: number } };
      channels: { name: string; harmonics: { order: number; rms: number | null }[] }[];
      diagnosis: { channels: { name: string; candidates: { family: string; parameters: Record<string, number>; fitErrorPercent: number; description: string }[] }[] };
      whatIf: { mitigations: { kind: string }[]; channels: { name: string; harmonics: { order: number; rms: number | null }[]; thdPercent: number; tddPercent: number | null }[]; compliance: { limitSet: { key: string }; revision: { number: number }; verdict: string }; warnings: string[] };
    };
    expect(out.diagnosis.channels.length).toBe(3);
    const candidates = out.diagnosis.channels[0]!.candidates;
    expect(candidates.length).toBe(3);
    expect(candidates[0]!.fitErrorPercent).toBeLessThanOrEqual(candidates[1]!.fitErrorPercent);
    expect(out.whatIf.mitigations.map((m) => m.kind)).toEqual(["reactor", "passive-filter"]);
    // A shunt filter tuned just below the 5th sinks most of the 5th (common practice, no source):
    // the predicted 5th is below the measured one.
    const measured5 = out.channels[0]!.harmonics.find((h) => h.order === 5)!.rms!;
    expect(out.whatIf.channels[0]!.harmonics.find((h) => h.order === 5)!.rms!).toBeLessThan(0.5 * measured5);
    expect(out.whatIf.compliance.limitSet.key).toBe(out.compliance.limitSet.key);
    expect(out.whatIf.compliance.revision).toEqual(out.compliance.revision);
  }, 150_000);

  it("a filter without --isc exits 1 with one line naming it; a bad spec names the spec", () => {
    const res = cli([file, "--json", "--mitigate", "filter=4.7@300kvar"]);
    expect(res.status).toBe(1);
    expect(res.stderr.trim().split("\n")).toHaveLength(1);
    expect(res.stderr).toContain("--isc");
    const bad = cli([file, "--mitigate", "pulses=9"]);
    expect(bad.status).toBe(1);
    expect(bad.stderr).toContain('mitigation "pulses=9": pulses must be 12 or 18');
  }, 150_000);
});
