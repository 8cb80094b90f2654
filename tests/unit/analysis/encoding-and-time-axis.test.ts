// Issue 9 §6: the encoding is detected once from the file's head and used for the preview and the
// analysis alike; time columns in h and min; a time column that runs backwards is named as such.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, test } from "vitest";
import { analyzeCsvFile } from "@/lib/analysis/analyze-csv-file";
import { analyzeCsvText } from "@/lib/analysis/analyze-csv-text";
import { detectEncoding } from "@/lib/analysis/detect-encoding";
import { AnalysisInputError } from "@/lib/analysis/errors";
import { inspectCsv } from "@/lib/analysis/inspect-csv";
import { decodeText } from "@/lib/captures/decode-text";

const fixture = (name: string): string => join(process.cwd(), "fixtures", name);
const dir = mkdtempSync(join(tmpdir(), "ordwise-encoding-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The generator's current: fundamental 14.1 A peak → 14.1/√2 A r.m.s. (sine: r.m.s. = peak/√2). */
const I1 = 14.1 / Math.SQRT2;

describe("detectEncoding", () => {
  // Byte-order marks: Unicode Standard 15.0, §23.8 (U+FEFF as EF BB BF in UTF-8, FF FE / FE FF in UTF-16 LE / BE).
  test.each([
    ["UTF-8 with BOM", [0xef, 0xbb, 0xbf, 0x74, 0x2c], "utf-8"],
    ["UTF-16 LE BOM", [0xff, 0xfe, 0x74, 0x00], "utf-16le"],
    ["UTF-16 BE BOM", [0xfe, 0xff, 0x00, 0x74], "utf-16be"],
    ["UTF-8 without BOM, µ as C2 B5", [0x74, 0x20, 0x28, 0xc2, 0xb5, 0x73, 0x29], "utf-8"],
    // Windows-1252 code page: µ is byte B5 (same as ISO/IEC 8859-1), not valid UTF-8 on its own.
    ["Windows-1252, µ as B5", [0x74, 0x20, 0x28, 0xb5, 0x73, 0x29], "windows-1252"],
    ["plain ASCII", [0x74, 0x2c, 0x31, 0x0a], "utf-8"],
    ["UTF-8 head cut inside a two-byte character", [0x74, 0x2c, 0x31, 0x0a, 0xc2], "utf-8"],
    ["UTF-16 LE without BOM (zero high bytes)", [0x74, 0x00, 0x2c, 0x00, 0x31, 0x00, 0x0a, 0x00], "utf-16le"],
  ])("%s", (_name, bytes, expected) => {
    expect(detectEncoding(Uint8Array.from(bytes))).toBe(expected);
  });
});

describe("one decoding for preview and analysis", () => {
  test("a Windows-1252 file headed Zeit (µs);Strom (A) previews and analyses identically", async () => {
    const bytes = readFileSync(fixture("latin1-zeit-strom.csv"));
    const preview = inspectCsv(decodeText(bytes));
    expect(preview.columns.map((c) => `${c.header}:${c.role}:${c.unit}`)).toEqual(["Zeit (µs):time:µs", "Strom (A):channel:A"]);
    // 6400 S/s: 1/6400 s = 156.25 µs, as written in the file.
    expect(preview.sampleIntervalS).toBeCloseTo(156.25e-6, 12);
    const streamed = await analyzeCsvFile(fixture("latin1-zeit-strom.csv"));
    expect(streamed.sampleIntervalSource).toBe("time-column");
    expect(streamed.sampleIntervalS).toBeCloseTo(156.25e-6, 12);
    expect(streamed.channels.map((c) => c.name)).toEqual(["Strom (A)"]);
    expect(streamed.channels[0]!.harmonics[0]!.rms!).toBeCloseTo(I1, 1);
    // The in-memory path on the preview's decoding gives the same numbers.
    const inMemory = analyzeCsvText(decodeText(bytes));
    expect(inMemory.channels[0]!.harmonics[0]!.rms!).toBeCloseTo(streamed.channels[0]!.harmonics[0]!.rms!, 12);
  });

  test.each(["utf16le-bom.csv", "utf16be-bom.csv"])("%s analyses (it used to answer 'no numeric columns')", async (name) => {
    const preview = inspectCsv(decodeText(readFileSync(fixture(name))));
    expect(preview.columns.map((c) => c.header)).toEqual(["Time (s)", "Va (V)", "Ia (A)"]);
    const result = await analyzeCsvFile(fixture(name));
    const utf8 = analyzeCsvText(decodeText(readFileSync(fixture(name))));
    expect(result.channels.map((c) => c.name)).toEqual(["Va (V)", "Ia (A)"]);
    expect(result.channels[1]!.harmonics[0]!.rms!).toBeCloseTo(I1, 1);
    expect(result.channels[1]!.harmonics[0]!.rms!).toBeCloseTo(utf8.channels[1]!.harmonics[0]!.rms!, 12);
  });

  test("a long UTF-16 file streams in two passes, decoded chunk by chunk, exactly like its UTF-8 twin", { timeout: 60_000 }, async () => {
    // 3 s at 6.4 kS/s = 19,200 rows ≈ 1.3 MB in UTF-16: past the look-ahead of 2 × 4096 rows and past one read chunk.
    const lines = ["Time (s),Va (V),Ia (A)"];
    for (let k = 0; k < 19_200; k++) {
      const t = k / 6400;
      lines.push(`${t.toFixed(7)},${(325 * Math.sin(2 * Math.PI * 50 * t)).toFixed(3)},${(14.1 * Math.sin(2 * Math.PI * 50 * t - 0.4)).toFixed(4)}`);
    }
    const text = `${lines.join("\n")}\n`;
    const path = join(dir, "long-utf16le.csv");
    writeFileSync(path, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, "utf16le")]));
    const streamed = await analyzeCsvFile(path, {}, undefined, { segmentSamples: 4096 });
    writeFileSync(join(dir, "long-utf8.csv"), text);
    const utf8 = await analyzeCsvFile(join(dir, "long-utf8.csv"), {}, undefined, { segmentSamples: 4096 });
    expect(streamed.channels[1]!.harmonics[0]!.rms!).toBeCloseTo(14.1 / Math.SQRT2, 3);
    expect(streamed.channels[1]!.harmonics[0]!.rms!).toBe(utf8.channels[1]!.harmonics[0]!.rms!);
  });
});

describe("time columns in hours and minutes", () => {
  /** 0.4 s at 6.4 kS/s, time written in the given unit with 10 significant digits. */
  function capture(header: string, perSecond: number): string {
    const lines = [`${header},Ia (A)`];
    for (let k = 0; k < 2560; k++) {
      const t = k / 6400;
      lines.push(`${(t * perSecond).toPrecision(10)},${(14.1 * Math.sin(2 * Math.PI * 50 * t)).toFixed(4)}`);
    }
    return `${lines.join("\n")}\n`;
  }
  // 1 h = 3600 s, 1 min = 60 s: SI Brochure, 9th edition (2019), Table 8.
  test.each([
    ["Time (h)", 1 / 3600],
    ["t [min]", 1 / 60],
    ["Zeit (µs)", 1e6],
  ])("%s", (header, perSecond) => {
    const result = analyzeCsvText(capture(header, perSecond));
    expect(result.sampleIntervalSource).toBe("time-column");
    expect(result.sampleIntervalS / (1 / 6400)).toBeCloseTo(1, 6);
  });
});

describe("a time column that runs backwards", () => {
  const text = readFileSync(fixture("error-time-backwards.csv"), "utf8");
  const expected = /^time axis runs backwards at line 3: 0\.2185938 s follows 0\.2187500 s|^time axis runs backwards at line 3: /;

  test("the preview names it with its line instead of asking for a sample interval", () => {
    const preview = inspectCsv(text);
    expect(preview.sampleIntervalS).toBeNull();
    expect(preview.timeAxisProblem).toMatch(expected);
  });

  test.each([
    ["in memory", () => analyzeCsvText(text)],
    ["in memory with a sample interval given", () => analyzeCsvText(text, { sampleIntervalS: 1 / 6400 })],
  ])("%s: an error at line 3, column 1", (_name, run) => {
    let error: unknown;
    try {
      run();
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(AnalysisInputError);
    expect(error).toMatchObject({ code: "non-monotonic-time", line: 3, column: 1 });
    expect((error as Error).message).toMatch(expected);
  });

  test("streaming, with and without a given interval", async () => {
    await expect(analyzeCsvFile(fixture("error-time-backwards.csv"))).rejects.toMatchObject({ code: "non-monotonic-time", line: 3 });
    await expect(analyzeCsvFile(fixture("error-time-backwards.csv"), { sampleIntervalS: 1 / 6400 })).rejects.toMatchObject({ code: "non-monotonic-time", line: 3 });
  });
});
