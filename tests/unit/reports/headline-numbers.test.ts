// Headline numbers of a sheet: the engine's analysis of analytic signals, read back through
// headlineNumbers/headlineTable, against values written out by hand from the definitions.
import { describe, expect, test } from "vitest";
import { analyzeSamples } from "@/lib/analysis/analyze-samples";
import { headlineNumbers } from "@/lib/reports/headline-numbers";
import { buildSheetCsv } from "@/lib/reports/build-sheet-csv";
import { buildSheetPdf } from "@/lib/reports/build-sheet-pdf";
import { headlineTable } from "@/lib/reports/headline-table";
import { makeSheet } from "./make-sheet";
import { pdfPageTexts, pdfText } from "./pdf-text";

const rate = 12_800;
const n = Math.round(0.4 * rate); // 20 cycles of 50 Hz
const deg = Math.PI / 180;

/**
 * Three phases a, b, c (−120°, +120°): voltage `vRms[k]` pure sine; current 10 A r.m.s. fundamental lagging
 * by `lagDeg`, plus a 3rd harmonic of 3 A r.m.s.
 */
function threePhase(lagDeg: number, vRms: [number, number, number] = [230, 230, 230]) {
  const phases = [
    ["a", 0],
    ["b", -120],
    ["c", 120],
  ] as const;
  const channels = phases.flatMap(([p, shift], idx) => {
    const v = new Float64Array(n);
    const i = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      const w = (2 * Math.PI * 50 * k) / rate + shift * deg;
      v[k] = vRms[idx]! * Math.SQRT2 * Math.cos(w);
      i[k] = Math.SQRT2 * (10 * Math.cos(w - lagDeg * deg) + 3 * Math.cos(3 * w + 0.4));
    }
    return [
      { name: `V${p}`, quantity: "voltage" as const, phase: p, samples: v },
      { name: `I${p}`, quantity: "current" as const, phase: p, samples: i },
    ];
  });
  return analyzeSamples({ sampleIntervalS: 1 / rate, channels }, { ilA: 20 });
}

describe("headlineNumbers", () => {
  // Hand calculation: I = √(10² + 3²) = 10.4403 A, THD = 3/10 = 30 %, TDD = 3/20 = 15 % (IEEE Std 519-2014 §3 definition),
  // K-factor Σ Ih²h² / Σ Ih² = (100 + 81)/109 = 1.66055 (UL 1561 form, as IEEE C57.110-2018 writes it),
  // P = V·I1·cos 30° = 230·10·0.866025 = 1991.858 W (the voltage carries no 3rd, so the 3rd carries no power),
  // S = V·I = 230·10.4403 = 2401.27 VA, displacement factor cos 30° = 0.866025 lagging,
  // distortion factor I1/I = 10/10.4403 = 0.957826, true PF = P/S = 0.829502 (IEEE 1459-2010 §3.2 terms).
  const h = headlineNumbers(threePhase(30), { ilA: 20 })!;
  const ia = h.channels.find((c) => c.name === "Ia")!;

  test("per current channel: f1, rms, fundamental rms, THD to its upper order, TDD with IL, K-factor", () => {
    expect(ia.fundamentalHz).toBeCloseTo(50, 3);
    expect(ia.rms).toBeCloseTo(Math.sqrt(109), 3);
    expect(ia.fundamentalRms).toBeCloseTo(10, 3);
    expect(ia.thdPercent).toBeCloseTo(30, 3);
    expect(ia.thdMaxOrder).toBe(40);
    expect(ia.tddPercent).toBeCloseTo(15, 3);
    expect(ia.ilA).toBe(20);
    expect(ia.kFactor).toBeCloseTo(181 / 109, 4);
  });

  test("crest factor is the peak of the analytic current over its r.m.s.", () => {
    // Peak of √2(10 cos(x − 30°) + 3 cos(3x + 0.4)) found by a fine sweep over one cycle, outside the engine.
    let peak = 0;
    for (let k = 0; k < 200_000; k++) {
      const x = (2 * Math.PI * k) / 200_000;
      peak = Math.max(peak, Math.abs(Math.SQRT2 * (10 * Math.cos(x - 30 * deg) + 3 * Math.cos(3 * x + 0.4))));
    }
    expect(ia.crestFactor!).toBeCloseTo(peak / Math.sqrt(109), 2);
  });

  test("voltage channels carry THD but no TDD", () => {
    const va = h.channels.find((c) => c.name === "Va")!;
    expect(va.thdPercent!).toBeLessThan(0.01);
    expect(va.tddPercent).toBeNull();
  });

  test("per V–I pair: P, S, displacement factor with lagging, distortion factor, true power factor", () => {
    const pair = h.power.find((p) => p.kind === "pair" && p.current === "Ia")!;
    expect(pair.activePowerW).toBeCloseTo(1991.858, 0);
    expect(pair.apparentPowerVA).toBeCloseTo(2401.27, 0);
    expect(pair.displacementFactor!).toBeCloseTo(0.866025, 4);
    expect(pair.leadLag).toBe("lagging");
    expect(pair.distortionFactor!).toBeCloseTo(0.957826, 4);
    expect(pair.truePowerFactor).toBeCloseTo(0.829502, 4);
  });

  test("three-phase total: ΣP, ΣS, and the same factors for a balanced set", () => {
    const total = h.power.find((p) => p.kind === "total")!;
    expect(total.activePowerW).toBeCloseTo(3 * 1991.858, 0);
    expect(total.apparentPowerVA).toBeCloseTo(3 * 2401.27, 0);
    expect(total.displacementFactor!).toBeCloseTo(0.866025, 4);
    expect(total.leadLag).toBe("lagging");
    expect(total.distortionFactor!).toBeCloseTo(0.957826, 4);
    expect(total.truePowerFactor).toBeCloseTo(0.829502, 4);
  });

  test("a leading current reads 'leading'", () => {
    const lead = headlineNumbers(threePhase(-30), {})!;
    expect(lead.power.find((p) => p.current === "Ia")!.leadLag).toBe("leading");
    expect(lead.power.find((p) => p.kind === "total")!.leadLag).toBe("leading");
  });

  test("voltage unbalance = |V2|/|V1| by the Fortescue transform written out here (Va 230, Vb 230, Vc 200 V)", () => {
    const h2 = headlineNumbers(threePhase(30, [230, 230, 200]), {})!;
    // a = 1∠120°. V1 = (Va + a·Vb + a²·Vc)/3, V2 = (Va + a²·Vb + a·Vc)/3, with Va = 230∠0, Vb = 230∠−120°, Vc = 200∠120°.
    const c = (m: number, d: number) => [m * Math.cos(d * deg), m * Math.sin(d * deg)] as const;
    const add = (...z: (readonly [number, number])[]) => z.reduce((s, x) => [s[0] + x[0], s[1] + x[1]] as const, [0, 0] as const);
    const v1 = add(c(230, 0), c(230, -120 + 120), c(200, 120 + 240));
    const v2 = add(c(230, 0), c(230, -120 + 240), c(200, 120 + 120));
    const expected = (100 * Math.hypot(...v2)) / Math.hypot(...v1);
    const set = h2.unbalance.find((u) => u.quantity === "voltage")!;
    expect(set.unbalancePercent).toBeCloseTo(expected, 2);
    expect(h2.unbalance.find((u) => u.quantity === "current")!.unbalancePercent).toBeLessThan(0.01);
  });

  test("no IL: no TDD, and the table leaves the TDD column out", () => {
    const noIl = headlineNumbers(threePhase(30), {})!;
    expect(noIl.channels.every((ch) => ch.tddPercent === null)).toBe(true);
    const currents = headlineTable(noIl).find((t) => t.key === "current")!;
    expect(currents.columns.map((col) => col.label).some((l) => l.startsWith("TDD"))).toBe(false);
  });

  test("values the engine could not compute (stored as null) read as a dash, never as a number", () => {
    const a = threePhase(30);
    const broken = { ...a, channels: a.channels.map((ch) => ({ ...ch, crestFactor: null as unknown as number, kFactor: Number.NaN })) };
    const hb = headlineNumbers(broken, {})!;
    expect(hb.channels[0]!.crestFactor).toBeNull();
    expect(hb.channels[0]!.kFactor).toBeNull();
    const row = headlineTable(hb).find((t) => t.key === "current")!.rows[0]!;
    expect(row.cells.slice(-2)).toEqual(["—", "—"]);
  });

  test("the table labels carry units and powers switch to kW/kVA for large values", () => {
    const tables = headlineTable(h);
    const currents = tables.find((t) => t.key === "current")!;
    expect(currents.columns.map((col) => col.label)).toEqual([
      "Fundamental frequency (Hz)",
      "RMS (A)",
      "Fundamental RMS (A)",
      "THD h2–h40 (% of fundamental)",
      "TDD (% of IL = 20 A)",
      "Crest factor",
      "K-factor",
    ]);
    expect(currents.rows[0]!.cells[3]).toBe("30.00");
    expect(currents.rows[0]!.cells[4]).toBe("15.00");
    const power = tables.find((t) => t.key === "power")!;
    expect(power.columns[0]!.label).toBe("P (kW)");
    expect(power.rows.at(-1)!.label).toBe("Three-phase total");
    expect(power.rows[0]!.cells[2]).toBe("0.866 lagging");
    // One value per row, but a table with its labelled column, not a list of statements.
    const unbalance = tables.find((t) => t.key === "unbalance")!;
    expect(unbalance.list).toBeUndefined();
    expect(unbalance.columns[0]!.label).toBe("Fundamental unbalance (negative / positive sequence, %)");
  });

  test("no analysis, no headline numbers", () => {
    expect(headlineNumbers(null, {})).toBeNull();
  });
});

describe("headline numbers in the PDF (page 1) and the CSV", () => {
  const base = makeSheet("iec-61000-3-2-class-a", { channels: [{ name: "Ia", fundamentalRms: 10, harmonics: { 3: 3 } }] }, { ilA: 20 });
  const sheet = { ...base, analysis: { result: threePhase(30) } };

  test("the CSV carries the tables with units in the labels and raw values", () => {
    const lines = buildSheetCsv(sheet).split("\r\n");
    expect(lines).toContain("Headline numbers: currents,Fundamental frequency (Hz),RMS (A),Fundamental RMS (A),THD h2–h40 (% of fundamental),TDD (% of IL = 20 A),Crest factor,K-factor");
    const ia = lines.find((l) => l.startsWith("Ia (phase A),"))!.split(",");
    expect(Number(ia[5])).toBeCloseTo(15, 2); // TDD 3 A / IL 20 A
    expect(lines).toContain("Headline numbers: power,P (kW),S (kVA),Displacement factor,Distortion factor,True power factor");
    const total = lines.find((l) => l.startsWith("Three-phase total,"))!.split(",");
    expect(Number(total[1])).toBeCloseTo((3 * 1991.858) / 1000, 2);
    // The per-order table still follows, after a blank line.
    expect(lines).toContain("channel,order,measured,limit,unit,percent_of_limit,margin,verdict,decided_by,table_limit,reason");
  });

  test("page 1 of the PDF lists them, before the evaluation context", async () => {
    const text = pdfText(await buildSheetPdf(sheet, { compress: false, generatedAt: new Date("2026-03-03T00:00:00Z") }));
    // The dash is WinAnsi 0x97 in the PDF's text.
    const at = text.search(/Headline numbers . power/);
    expect(at).toBeGreaterThan(0);
    expect(at).toBeLessThan(text.indexOf("Evaluation context"));
    expect(text).toContain("Three-phase total");
    expect(text).toContain("0.866 lagging");
    expect(text).toContain("Fundamental unbalance (negative / positive sequence, %)");
  });

  test("all of them fit on page 1 beside a full set-up (six mapped channels and the file hash), which follows them", async () => {
    const channels = Object.fromEntries(["Va", "Vb", "Vc", "Ia", "Ib", "Ic"].map((name) => [name, { quantity: name.startsWith("V") ? "voltage" : "current", scale: 1 }]));
    const withSetup = { ...sheet, analysis: { result: threePhase(30), setup: { mapping: { channels } }, fileSha256: "ab".repeat(32) } };
    const pages = pdfPageTexts(await buildSheetPdf(withSetup, { compress: false, generatedAt: new Date("2026-03-03T00:00:00Z") }));
    expect(pages.length).toBeGreaterThan(1);
    const first = pages[0]!;
    for (const table of ["currents", "voltages", "power", "unbalance"]) expect(first).toMatch(new RegExp(`Headline numbers . ${table}`));
    expect(first).toContain("Three-phase total");
    expect(first.indexOf("Set-up behind this result")).toBeGreaterThan(first.search(/Headline numbers . unbalance/));
  });
});
