// Nothing non-finite reaches a verdict: overflowed measurements and limits that are not numbers
// are "not evaluated" with a cause code, never a pass; formulas that give unusable limits are
// refused on save; hostile formulas are syntax errors, not stack overflows.
import { describe, expect, test } from "vitest";
import { approxEqual } from "@/lib/compliance/approx-equal";
import { formulaValueIssues } from "@/lib/compliance/check-formula-values";
import { judgeWithSeed } from "@/tests/support/judge-with-seed";
import { evaluateCompliance } from "@/lib/compliance/evaluate-compliance";
import { FormulaSyntaxError, MAX_FORMULA_DEPTH, MAX_FORMULA_LENGTH, parseFormula } from "@/lib/compliance/parse-formula";
import { getSeedLimitSet } from "@/lib/compliance/seed";
import { SavableRevisionContentSchema } from "@/lib/validations/limit-set";
import { makeAnalysis } from "./make-analysis";

describe("approxEqual with non-finite values", () => {
  test("Infinity is not 'at' a finite limit (IEEE 754: ∞ − x = ∞, and ∞ ≤ tol·∞ held before)", () => {
    expect(approxEqual(Infinity, 2.3)).toBe(false);
    expect(approxEqual(2.3, Infinity)).toBe(false);
    expect(approxEqual(Number.NaN, Number.NaN)).toBe(false);
    expect(approxEqual(Infinity, Infinity)).toBe(true);
  });
});

describe("evaluator: an overflowed measurement is not evaluated, never a pass", () => {
  test("a channel whose r.m.s. overflowed (one 1e308 cell squares to ∞): every row not evaluated, verdict incomplete", () => {
    const analysis = makeAnalysis({ channels: [{ name: "I", fundamentalRms: 8, harmonics: { 3: 1 } }] });
    analysis.channels[0]!.rms = Infinity;
    const result = judgeWithSeed(analysis, "iec-61000-3-2-class-a");
    expect(result.verdict).toBe("incomplete");
    expect(result.rows.every((row) => row.verdict === "not-evaluated")).toBe(true);
    expect(result.rows[0]).toMatchObject({ cause: { code: "non-finite", quantity: "measured" }, percentOfLimit: null, margin: null });
    // JSON keeps every number: nothing Infinity/NaN that would silently become null.
    expect(JSON.parse(JSON.stringify(result))).toEqual(result);
  });

  test("an order whose value is ∞ is not evaluated; its neighbours are still judged (IEC 61000-3-2:2018+A1:2020 Table 1 h5 1.14 A)", () => {
    const analysis = makeAnalysis({ channels: [{ name: "I", fundamentalRms: 8, harmonics: { 5: 1.0 } }] });
    analysis.channels[0]!.harmonics[2]!.rms = Infinity; // order 3
    const result = judgeWithSeed(analysis, "iec-61000-3-2-class-a");
    const h3 = result.rows.find((row) => row.order === 3)!;
    expect(h3).toMatchObject({ verdict: "not-evaluated", measured: null, cause: { code: "non-finite", quantity: "measured" } });
    expect(result.rows.find((row) => row.order === 5)).toMatchObject({ verdict: "pass", limit: 1.14 });
    expect(result.verdict).toBe("incomplete");
    expect(JSON.parse(JSON.stringify(result))).toEqual(result);
  });

  test("a stored revision whose formula gives ∞ at one order (1/(h-3) at h = 3) leaves that order not evaluated", () => {
    // Class A's set with its order rows replaced (no time rules: the capture mean decides).
    const content = structuredClone(getSeedLimitSet("iec-61000-3-2-class-a")!.content);
    content.rules.timeRules = [];
    content.bands[0]!.orderRows = [{ from: 2, to: 5, parity: "all", formula: "1/(h-3)", basis: "A" }];
    content.bands[0]!.aggregates = [];
    const analysis = makeAnalysis({ channels: [{ name: "I", fundamentalRms: 8, harmonics: { 3: 1, 5: 0.3 } }] });
    const result = evaluateCompliance({ analysis, limitSet: { key: "bad-formula", name: "Bad formula", revision: { id: 1, number: 1 }, content }, context: {} });
    expect(result.rows.find((row) => row.order === 3)).toMatchObject({ verdict: "not-evaluated", limit: null, cause: { code: "non-finite", quantity: "limit" } });
    // 1/(5-3) = 0.5 A ≥ 0.3 A: order 5 passes (arithmetic, written out).
    expect(result.rows.find((row) => row.order === 5)).toMatchObject({ verdict: "pass", limit: 0.5 });
    expect(result.verdict).toBe("incomplete");
  });
});

describe("limit formulas checked for every order they cover", () => {
  const withFormula = (formula: string, from = 2, to = 5) => ({
    bands: [{ orderRows: [{ from, to, parity: "all" as const, formula }], aggregates: [] }],
  });

  test.each([
    ["1/0", 2, "Infinity"],
    ["0/0", 2, "NaN"],
    ["-1", 2, "-1"],
    ["1/(h-4)", 4, "Infinity"],
    ["3-h", 4, "-1"],
  ])("%s is refused naming order %d and the value %s", (formula, order, value) => {
    // Orders 4–5 for the formulas of h, so the first bad order is the one named.
    const issues = formulaValueIssues(formula.includes("h") ? withFormula(formula, 4, 5) : withFormula(formula));
    expect(issues).toHaveLength(1);
    expect(issues[0]!.path).toEqual(["bands", 0, "orderRows", 0, "formula"]);
    expect(issues[0]!.message).toBe(`order ${order}: formula "${formula}" gives ${value}; a limit must be a finite number ≥ 0`);
  });

  test("the seed tables' formulas all give usable limits", () => {
    for (const key of ["iec-61000-3-2-class-a", "iec-61000-3-2-class-c", "iec-61000-3-2-class-d"]) {
      const set = getSeedLimitSet(key)!;
      expect(formulaValueIssues(set.content)).toEqual([]);
    }
  });

  test("a formula of λ is checked at λ = 0.05, 0.5 and 1 (30·λ % of I1, IEC 61000-3-2:2018+A1:2020 Table 2 Class C h3, stays ≥ 0)", () => {
    expect(formulaValueIssues(withFormula("30*lambda", 3, 3))).toEqual([]);
    expect(formulaValueIssues(withFormula("1/(1-lambda)", 3, 3))[0]!.message).toBe('order 3, λ = 1: formula "1/(1-lambda)" gives Infinity; a limit must be a finite number ≥ 0');
  });

  test("the save schema refuses the revision with the formula's path", () => {
    const content = structuredClone(getSeedLimitSet("iec-61000-3-2-class-a")!.content);
    const row = content.bands[0]!.orderRows.find((candidate) => candidate.formula !== undefined)!;
    row.formula = "1/0";
    const parsed = SavableRevisionContentSchema.safeParse(content);
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.some((issue) => issue.message.includes('formula "1/0" gives Infinity'))).toBe(true);
  });
});

describe("formula parser caps length and nesting", () => {
  test.each([
    ["10,000 nested parentheses", `${"(".repeat(10_000)}1${")".repeat(10_000)}`],
    ["100,000 unary minus", `${"-".repeat(100_000)}1`],
    [`${MAX_FORMULA_DEPTH + 1} nested parentheses`, `${"(".repeat(MAX_FORMULA_DEPTH + 1)}1${")".repeat(MAX_FORMULA_DEPTH + 1)}`],
    [`${MAX_FORMULA_DEPTH + 1} unary minus`, `${"-".repeat(MAX_FORMULA_DEPTH + 1)}1`],
    ["a power tower 2^2^…", `${"2^".repeat(MAX_FORMULA_DEPTH + 1)}2`],
    [`${MAX_FORMULA_LENGTH + 1} characters`, `1${"+1".repeat(MAX_FORMULA_LENGTH / 2)}`],
  ])("%s → a syntax error, not a stack overflow", (_name, formula) => {
    expect(() => parseFormula(formula)).toThrow(FormulaSyntaxError);
  });

  test(`${MAX_FORMULA_DEPTH} levels and ${MAX_FORMULA_LENGTH} characters still parse`, () => {
    expect(parseFormula(`${"(".repeat(MAX_FORMULA_DEPTH)}2${")".repeat(MAX_FORMULA_DEPTH)}`).evaluate({})).toBe(2);
    const terms = Math.floor((MAX_FORMULA_LENGTH - 1) / 2);
    const long = `1${"+1".repeat(terms)}`;
    expect(long.length).toBeLessThanOrEqual(MAX_FORMULA_LENGTH);
    expect(parseFormula(long).evaluate({})).toBe(terms + 1);
  });
});
