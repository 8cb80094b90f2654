import { describe, expect, test } from "vitest";
import { evaluateFormula } from "@/lib/compliance/evaluate-formula";
import { FormulaSyntaxError, FormulaVariableError, parseFormula, type FormulaVariables } from "@/lib/compliance/parse-formula";

describe("evaluateFormula — valid formulas", () => {
  test.each<[string, FormulaVariables, number, string]>([
    // formula, variables, expected, source of the expected value
    ["0.15*15/h", { h: 15 }, 0.15, "IEC 61000-3-2:2018+A1:2020 Table 1 Class A formula, n = 15 (computed from formula)"],
    ["0.15*15/h", { h: 21 }, 0.10714, "IEC 61000-3-2:2018+A1:2020 Table 1 Class A, n = 21 → 0.1071 A (computed from formula)"],
    ["0.23*8/h", { h: 40 }, 0.046, "IEC 61000-3-2:2018+A1:2020 Table 1 Class A, n = 40 → 0.046 A (computed from formula)"],
    ["30*lambda", { lambda: 0.9 }, 27, "IEC 61000-3-2:2018+A1:2020 Table 2 Class C third harmonic 30·λ % (arithmetic)"],
    ["3.85/h", { h: 11 }, 0.35, "IEC 61000-3-2:2018+A1:2020 Table 3 Class D: 3.85/11 = 0.35 mA/W (computed from formula)"],
    ["1.5*(0.15*15/h)", { h: 21 }, 0.16071, "IEC 61000-3-2:2018+A1:2020 Class B = 1.5 × Table 1, n = 21 → 0.1607 A (computed from formula)"],
    ["2+3*4", {}, 14, "arithmetic precedence, common practice, no source"],
    ["(2+3)*4", {}, 20, "parentheses, common practice, no source"],
    ["10-3-2", {}, 5, "- is left-associative, common practice, no source"],
    ["8/4/2", {}, 1, "/ is left-associative, common practice, no source"],
    ["-2^2", {}, -4, "^ binds tighter than unary minus (common practice)"],
    ["2^3^2", {}, 512, "^ is right-associative (common practice)"],
    ["1e-3*P", { P: 500 }, 0.5, "exponent notation, common practice, no source; P in W"],
    [".5 + h", { h: 2 }, 2.5, "leading-dot decimal and whitespace, common practice, no source"],
  ])("%s with %o = %d (%s)", (formula, variables, expected) => {
    expect(evaluateFormula(formula, variables)).toBeCloseTo(expected, 4);
  });

  test("reports the variables a formula uses, in a fixed order", () => {
    expect(parseFormula("P*3.85/h*lambda").variables).toEqual(["h", "P", "lambda"]);
    expect(parseFormula("2.3").variables).toEqual([]);
  });
});

describe("parseFormula — errors name the position (1-based)", () => {
  test.each([
    ["0.15*15/x", 9, 'unknown identifier "x" (allowed: h, P, lambda)'],
    ["Math.max(h, 1)", 1, 'unknown identifier "Math"'],
    ["process.exit(1)", 1, 'unknown identifier "process"'],
    ["constructor", 1, 'unknown identifier "constructor"'],
    ["0.15*(15/h", 11, 'expected ")"'],
    ["2**3", 3, 'unexpected "*"'],
    ["h h", 3, 'unexpected identifier "h"'],
    ["h(2)", 2, 'unexpected "("'],
    ["1;2", 2, 'unexpected character ";"'],
    ["'a'", 1, "unexpected character"],
    ["3 +", 4, "unexpected end of formula"],
    ["", 1, "empty formula"],
  ])("%j → position %d", (formula, position, fragment) => {
    let caught: unknown;
    try {
      parseFormula(formula);
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(FormulaSyntaxError);
    const error = caught as FormulaSyntaxError;
    expect(error.position).toBe(position);
    expect(error.message).toContain(fragment);
    expect(error.message).toContain(`at position ${position}`);
  });

  test("a used variable without a value is a FormulaVariableError naming it", () => {
    expect(() => evaluateFormula("30*lambda", { h: 3 })).toThrow(FormulaVariableError);
    expect(() => evaluateFormula("30*lambda", { h: 3 })).toThrow(/needs a value for lambda/);
  });
});
