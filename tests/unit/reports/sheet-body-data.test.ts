// What the sheet page reads and hands its interactive part: a real evaluation split into its head and its
// channel blocks, and the shown channel without provenance texts.
import { describe, expect, test } from "vitest";
import { splitResult } from "@/lib/reports/result-head";
import { sheetBodyData } from "@/lib/reports/sheet-body-data";
import { unpackSheetBody } from "@/lib/reports/unpack-sheet-body";
import type { ComplianceAggregate, ComplianceRow } from "@/lib/compliance/result";
import { judgeWithSeed } from "@/tests/support/judge-with-seed";
import { makeAnalysis } from "../compliance/make-analysis";

// IEC 61000-3-2:2018+A1:2020 Table 1 (Class A): h3 ≤ 2.30 A, h5 ≤ 1.14 A. Ia's 2.5 A at h3 and 1.2 A at h5 fail;
// Ib's 1.0 A and 0.5 A pass.
const result = judgeWithSeed(
  makeAnalysis({
    channels: [
      { name: "Ib", phase: "b", fundamentalRms: 8, harmonics: { 3: 1.0, 5: 0.5 } },
      { name: "Ia", phase: "a", fundamentalRms: 8, harmonics: { 3: 2.5, 5: 1.2 } },
    ],
  }),
  "iec-61000-3-2-class-a",
);

describe("splitResult", () => {
  test("the head lists every channel, worst first, with the worst channel's failing orders, and no rows", () => {
    const { head, channels } = splitResult(result);
    expect(head.channels).toEqual([
      { channel: "Ia", phase: "a", verdict: "fail" },
      { channel: "Ib", phase: "b", verdict: "pass" },
    ]);
    expect(head.failingOrders).toEqual([3, 5]);
    expect(head.verdict).toBe("fail");
    expect(head).not.toHaveProperty("rows");
    expect(head).not.toHaveProperty("aggregates");
    expect(channels.map((c) => c.channel)).toEqual(["Ia", "Ib"]);
    expect(channels[0]!.rows.find((r) => r.order === 3)?.measured).toBe(2.5);
  });

  test("a result that lists no channels shows its top level as the one channel", () => {
    const { head, channels } = splitResult({ ...result, channels: [] });
    expect(channels.map((c) => c.channel)).toEqual([result.channel]);
    expect(channels[0]!.rows).toEqual(result.rows);
    expect(head.channels).toEqual([{ channel: result.channel, phase: null, verdict: "fail" }]);
  });
});

describe("sheetBodyData", () => {
  test("carries one channel's rows without the per-row and per-rule sources, keeping verdicts and limits", () => {
    const { head, channels } = splitResult(result);
    const ib = channels[1]!;
    // The stored channel carries the sources of its limits and rules.
    expect(JSON.stringify(ib)).toContain('"limitSource"');
    expect(ib.rows.some((r) => r.rowRules?.some((rule) => rule.source))).toBe(true);
    const data = unpackSheetBody(sheetBodyData(head, ib));
    expect(data.channels).toEqual(head.channels);
    expect(data.channel.channel).toBe("Ib");
    expect(JSON.stringify(data)).not.toContain('"limitSource"');
    expect(data.channel.rows.some((r) => r.rowRules?.some((rule) => "source" in rule))).toBe(false);
    expect(data.channel.rows.some((r) => r.rowRules?.length)).toBe(true);
    expect(data.channel.rows.map((r) => r.order)).toEqual(ib.rows.map((r) => r.order));
    const h3 = data.channel.rows.find((r) => r.order === 3)!;
    expect(h3.limit).toBeCloseTo(2.3, 10);
    expect(h3.measured).toBe(1.0);
    expect(h3.verdict).toBe("pass");
    expect(data.context).toEqual(result.context);
  });

  test("sends each rule's shared words once per channel, and the rows unpack to the stored ones without sources", () => {
    const { head, channels } = splitResult(result);
    const ia = channels[0]!;
    const payload = sheetBodyData(head, ia);
    const ruleResults = ia.rows.reduce((n, r) => n + (r.rowRules?.length ?? 0), 0) + ia.aggregates.reduce((n, a) => n + (a.rowRules?.length ?? 0), 0);
    expect(ruleResults).toBeGreaterThan(40);
    // Each rule's label is in the shared parts once however many orders it judged, and in no row.
    const label = ia.rows.find((r) => r.rowRules?.length)!.rowRules![0]!.label;
    expect(JSON.stringify(payload.ruleParts).split(JSON.stringify(label)).length - 1).toBe(1);
    expect(JSON.stringify(payload.channel.rows)).not.toContain(label);
    expect(payload.ruleParts.length).toBeLessThan(ruleResults / 4);
    // Unpacked, every row and aggregate is the stored one less its sources (and stored words a typed statistic replaces).
    const withoutSources = <T extends ComplianceRow | ComplianceAggregate>({ limitSource: _l, ...row }: T) => ({
      ...row,
      ...(row.rowRules ? { rowRules: row.rowRules.map(({ source: _s, statistic, ...rule }) => (rule.measures || statistic === undefined ? rule : { ...rule, statistic })) } : {}),
    });
    const unpacked = unpackSheetBody(payload).channel;
    expect(unpacked.rows).toEqual(ia.rows.map(withoutSources));
    expect(unpacked.aggregates).toEqual(ia.aggregates.map(withoutSources));
  });
});
