// Every word a reader gets — sheet, share page, PDF and CSV — in plain language: the demo scenario's records,
// judged through the worker's own pipeline against every seeded limit set in the demo's context and in
// contexts that leave inputs out (band not chosen, IL or rated power missing, a bound hit exactly, a band
// condition not confirmed). No internal identifier may reach a reader: no camelCase field names (rowRules,
// decidedBy, assertedConditions), no rule, condition or limit-set ids (daily-p99-very-short,
// iec-61000-3-2-class-a), no "snapshot", no provenance markers of the seed files.
import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, test } from "vitest";
import type { AnalysisResult } from "@/lib/analysis/types";
import { EvaluationContextSchema, type EvaluationContext } from "@/lib/compliance/model";
import type { ComplianceResult } from "@/lib/compliance/result";
import { seedLimitSets } from "@/lib/compliance/seed";
import { importIntervalLog } from "@/lib/intervals/import-interval-log";
import { inspectIntervalLog } from "@/lib/intervals/inspect-interval-log";
import { runCaptureAnalysis } from "@/lib/pipeline/run-capture-analysis";
import { runCaptureEvaluation } from "@/lib/pipeline/run-capture-evaluation";
import { runIntervalLogEvaluation } from "@/lib/pipeline/run-interval-log-evaluation";
import { seedLimitSetRevision } from "@/lib/pipeline/seed-limit-set-revision";
import { buildSheetCsv } from "@/lib/reports/build-sheet-csv";
import { buildSheetPdf } from "@/lib/reports/build-sheet-pdf";
import { describeSetup } from "@/lib/reports/describe-setup";
import { groupReasons } from "@/lib/reports/format";
import { causeText, powerChoiceRows, timeRuleSummaryNote } from "@/lib/reports/result-wording";
import type { SheetReport } from "@/lib/reports/sheet-report";
import { decidedByLabel, describeTimeBasis, formatPercentOfLimit, formatRulePercentOfLimit, timeRuleLines } from "@/lib/reports/time-rules";
import { demoCaptures } from "@/db/seed/demo-captures";
import { internalNames } from "../../support/internal-names";
import { pdfText } from "./pdf-text";

const fixtures = path.resolve(__dirname, "../../../fixtures");

/** Contexts per limit set: the demo's kind of context, and ones that leave inputs out or sit on a bound. */
const contexts: Record<string, EvaluationContext[]> = {
  "ieee-519-2014-current": [{}, { busVoltageV: 11000 }, { iscA: 5200, ilA: 260, busVoltageV: 11000 }, { iscA: 8200, ilA: 260, busVoltageV: 11000, nominalVoltageV: 6351 }],
  "ieee-519-2022-current": [{}, { iscA: 8200, ilA: 260, busVoltageV: 11000 }],
  "ieee-519-2014-voltage": [{}, { busVoltageV: 11000, nominalVoltageV: 6351 }],
  "iec-61000-3-2-class-a": [{}, { nominalVoltageV: 230 }],
  "iec-61000-3-2-class-b": [{}],
  "iec-61000-3-2-class-c": [{}, { ratedPowerW: 20 }, { ratedPowerW: 180, lambda: 0.9 }],
  "iec-61000-3-2-class-d": [{}, { ratedPowerW: 180 }, { ratedPowerW: 400 }],
  "iec-61000-3-12": [
    {},
    { rsce: 33, phaseConfig: "balanced-three-phase", irefA: 200 },
    { rsce: 120, phaseConfig: "balanced-three-phase" },
    { rsce: 120, phaseConfig: "balanced-three-phase", assertedConditions: ["iec-61000-3-12-table-4-conditions"] },
    { rsce: 120, phaseConfig: "single-phase" },
  ],
};

interface Judged {
  label: string;
  result: ComplianceResult;
  analysis: AnalysisResult;
  setup: Record<string, unknown>;
}

const judged: Judged[] = [];

beforeAll(async () => {
  for (const demo of demoCaptures) {
    const file = path.join(fixtures, demo.file);
    if (demo.kind === "interval-log") {
      const text = fs.readFileSync(file, "utf8");
      const mapping = inspectIntervalLog(text).suggestion.mapping!;
      const log = importIntervalLog(text, mapping);
      for (const key of ["ieee-519-2014-current", "iec-61000-3-2-class-a"]) {
        for (const context of [demo.context, ...(contexts[key] ?? [])]) {
          const { analysis, result } = runIntervalLogEvaluation(log, seedLimitSetRevision(key), EvaluationContextSchema.parse(context), 60);
          judged.push({ label: `${demo.title} / ${key} / ${JSON.stringify(context)}`, result, analysis, setup: { mapping: { intervalMapping: mapping }, unmappedColumns: log.unmappedColumns } });
        }
      }
      continue;
    }
    const { analysis } = await runCaptureAnalysis(file, demo.mapping ?? { channels: {} }, demo.context);
    for (const set of seedLimitSets()) {
      for (const context of [demo.context, ...(contexts[set.key] ?? [{}])]) {
        const result = runCaptureEvaluation(analysis, seedLimitSetRevision(set.key), EvaluationContextSchema.parse(context));
        judged.push({ label: `${demo.title} / ${set.key} / ${JSON.stringify(context)}`, result, analysis, setup: { mapping: demo.mapping ?? { channels: {} } } });
      }
    }
  }
}, 120_000);

function sheetOf(j: Judged): SheetReport {
  return {
    capture: { id: "00000000-0000-4000-8000-000000000001", title: "Demo record", originalFilename: "demo.csv", capturedAt: null, createdAt: new Date("2026-03-02T10:00:00Z"), reviewState: "approved" },
    site: { name: "Demo site", nominalVoltageV: 230, frequencyHz: 50 },
    uploaderName: "Priya Okonkwo-Hale",
    evaluation: {
      id: "00000000-0000-4000-8000-0000000000e1",
      verdict: j.result.verdict,
      limitSetKey: j.result.limitSet.key,
      limitSetName: j.result.limitSet.name,
      revisionNumber: 1,
      createdAt: new Date("2026-03-02T10:01:00Z"),
      createdByName: null,
      result: j.result,
    },
    analysis: { result: j.analysis, setup: j.setup, fileSha256: "ab".repeat(32) },
    reviews: [],
  };
}

/** The words the signed-in sheet and the share page render from a result (the same functions they call). */
function sheetWords(j: Judged): string[] {
  const r = j.result;
  const words: string[] = [...r.notes, r.band.label ?? "", r.band.reason, ...describeSetup({ analysis: { result: j.analysis, setup: j.setup } }).flat(2).filter((w): w is string => typeof w === "string")];
  if (r.timeBasis) words.push(...describeTimeBasis(r.timeBasis).flat());
  if (r.power) words.push(...powerChoiceRows(r.power).flat());
  for (const ch of r.channels) {
    words.push(ch.band.label ?? "", ch.band.reason, ...ch.derived.notes, ...(ch.band.options ?? []).map((o) => o.label));
    words.push(...groupReasons(ch.rows).map((g) => g.reason));
    for (const c of ch.conditions) words.push(c.text, c.reason);
    for (const line of timeRuleLines(ch.timeRules, ch.rows, ch.aggregates)) words.push(line.label, line.statistic, line.note ?? "", line.interval ?? "", line.period ?? "");
    for (const s of ch.timeRules ?? []) words.push(timeRuleSummaryNote(s) ?? "");
    for (const row of [...ch.rows, ...ch.aggregates]) {
      words.push(row.reason ?? "", decidedByLabel(row), formatPercentOfLimit(row), row.cause ? causeText(row.cause) : "");
      for (const rule of row.rowRules ?? []) words.push(rule.label, rule.reason ?? "", formatRulePercentOfLimit(rule), rule.cause ? causeText(rule.cause) : "");
    }
  }
  return words.filter((w) => w !== "");
}

/** The text around the first occurrence of `name`, for the failure message. */
function around(text: string, name: string): string {
  const at = text.indexOf(name);
  return text.slice(Math.max(0, at - 100), at + name.length + 60).replace(/\s+/g, " ");
}

describe("the words a reader gets name no internal identifier", () => {
  test("the detector finds what it is meant to find", () => {
    expect(internalNames('not evaluated: see rowRules; decided by daily-p99-very-short; assert it with the id "iec-61000-3-12-table-4-conditions"')).toEqual(
      expect.arrayContaining(["rowRules", "daily-p99-very-short", "iec-61000-3-12-table-4-conditions"]),
    );
    expect(internalNames("asserted by the user (context.assertedConditions)")).toEqual(expect.arrayContaining(["assertedConditions", "context."]));
    expect(internalNames("0.15 mA/W × 180 W = 27 mA; 11 kV bus, 3000 kvar; the daily 99th percentile")).toEqual([]);
  });

  test("sheet and share-page words of every demo record under every seeded limit set", () => {
    expect(judged.length).toBeGreaterThan(60);
    const offenders = new Map<string, string>();
    for (const j of judged) for (const w of sheetWords(j)) for (const name of internalNames(w)) if (!offenders.has(name)) offenders.set(name, `«${name}» in “${w.slice(0, 200)}” (${j.label})`);
    expect([...offenders.values()]).toEqual([]);
  }, 60_000);

  test("the CSV of each of them", () => {
    const offenders = new Map<string, string>();
    for (const j of judged) {
      const csv = buildSheetCsv(sheetOf(j));
      for (const name of internalNames(csv)) if (!offenders.has(name)) offenders.set(name, `«${name}» in “${around(csv, name)}” (${j.label})`);
    }
    expect([...offenders.values()]).toEqual([]);
  }, 60_000);

  test("the PDF of each of them", async () => {
    const offenders = new Map<string, string>();
    for (const j of judged) {
      const text = pdfText(await buildSheetPdf(sheetOf(j), { compress: false }));
      for (const name of internalNames(text)) if (!offenders.has(name)) offenders.set(name, `«${name}» in “${around(text, name)}” (${j.label})`);
    }
    expect([...offenders.values()]).toEqual([]);
  }, 120_000);
});
