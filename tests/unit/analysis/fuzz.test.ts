// Fuzz: randomly mutated and truncated CSVs (seeded, reproducible) through importer and pipeline.
// Each must end in a result or an AnalysisInputError — never another exception or a hang.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, expect, test } from "vitest";
import { analyzeCsvFile } from "@/lib/analysis/analyze-csv-file";
import { analyzeCsvText } from "@/lib/analysis/analyze-csv-text";
import { AnalysisInputError } from "@/lib/analysis/errors";
import { inspectCsv } from "@/lib/analysis/inspect-csv";
import { mulberry32 } from "./signals";

const rate = 3200;
function base(variant: number): string {
  const rows: string[] = [];
  const sep = variant % 3 === 0 ? "," : variant % 3 === 1 ? ";" : "\t";
  const dec = (x: number, d: number) => (sep === "," ? x.toFixed(d) : x.toFixed(d).replace(".", ","));
  if (variant % 2 === 0) rows.push("Sample Interval" + sep + "3.125E-04", "Record Length" + sep + "720", "");
  rows.push(variant % 2 === 0 ? ["Va (V)", "Ia (A)"].join(sep) : ["Time (s)", "Va [V]", "Ia [A]"].join(sep));
  for (let k = 0; k < 720; k++) {
    const w = (2 * Math.PI * 50 * k) / rate;
    const cells = [dec(325 * Math.cos(w), 2), dec(10 * Math.cos(w - 0.3) + 3 * Math.cos(3 * w), 3)];
    rows.push((variant % 2 === 0 ? cells : [dec(k / rate, 6), ...cells]).join(sep));
  }
  return rows.join(variant % 5 === 0 ? "\r\n" : "\n") + "\n";
}

const ALPHABET = [",", ";", "\t", '"', "\n", "\r\n", " ", "a", "-", "+", ".", "e", "E", "0", "9", "NaN", "∞", "\uFEFF", "1e999", ""];

function mutate(text: string, rnd: () => number): string {
  let out = text;
  const edits = 1 + Math.floor(rnd() * 6);
  for (let e = 0; e < edits; e++) {
    const at = Math.floor(rnd() * (out.length + 1));
    const kind = Math.floor(rnd() * 8);
    if (kind === 0) out = out.slice(0, at); // truncate
    else if (kind === 1) out = out.slice(0, at) + out.slice(at + 1 + Math.floor(rnd() * 40)); // delete a run
    else if (kind === 2) out = out.slice(0, at) + ALPHABET[Math.floor(rnd() * ALPHABET.length)] + out.slice(at); // insert
    else if (kind === 3) {
      const lines = out.split("\n");
      const i = Math.floor(rnd() * lines.length);
      const j = Math.floor(rnd() * lines.length);
      [lines[i], lines[j]] = [lines[j]!, lines[i]!]; // swap lines
      out = lines.join("\n");
    } else if (kind === 4) {
      const lines = out.split("\n");
      const i = Math.floor(rnd() * lines.length);
      lines.splice(i, 0, lines[i] ?? ""); // duplicate a line
      out = lines.join("\n");
    } else if (kind === 5) out = out.slice(0, at) + ALPHABET[Math.floor(rnd() * ALPHABET.length)] + out.slice(at + 1); // replace a char
    else if (kind === 6) out = out.slice(0, Math.floor(out.length * rnd() * 0.3)); // heavy truncation
    else out = out.replace(/\d/g, (d) => (rnd() < 0.001 ? "x" : d)); // sprinkle letters
  }
  return out;
}

const CASES = 1200;
const dir = mkdtempSync(join(tmpdir(), "ordwise-fuzz-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

test(`${CASES} mutated CSVs end in a result or an AnalysisInputError`, async () => {
  const rnd = mulberry32(20240519);
  const outcomes = { ok: 0, inputError: 0 };
  for (let c = 0; c < CASES; c++) {
    const text = mutate(base(c), rnd);
    const where = `case ${c}`;
    for (const run of [() => analyzeCsvText(text), () => inspectCsv(text)]) {
      try {
        const result = run();
        if ("fundamentalHz" in result) {
          expect(Number.isFinite(result.fundamentalHz), where).toBe(true);
          JSON.stringify(result);
        }
        outcomes.ok++;
      } catch (error) {
        if (!(error instanceof AnalysisInputError)) throw new Error(`${where}: ${String(error)}\n${(error as Error).stack}`);
        expect(error.message.length, where).toBeGreaterThan(0);
        outcomes.inputError++;
      }
    }
    if (c % 12 === 0) {
      // the streaming path must agree with the text path on the outcome
      const path = join(dir, `case-${c}.csv`);
      writeFileSync(path, text);
      let textOutcome = "ok";
      try {
        analyzeCsvText(text);
      } catch (error) {
        textOutcome = (error as AnalysisInputError).message;
      }
      const fileOutcome = await analyzeCsvFile(path).then(
        () => "ok",
        (error: unknown) => {
          if (!(error instanceof AnalysisInputError)) throw new Error(`${where} (file): ${String(error)}`);
          return error.message;
        },
      );
      expect(fileOutcome, where).toBe(textOutcome);
    }
  }
  // both outcomes must occur, or the mutations are not exercising anything
  expect(outcomes.ok).toBeGreaterThan(100);
  expect(outcomes.inputError).toBeGreaterThan(100);
}, 60_000);
