// Results are data: no module that renders them (lib/reports, app/) may apply a regular
// expression to a result's text (reason, description, statistic). Words are generated from
// typed fields in lib/reports/result-wording.ts and never parsed back (common practice, no source).
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import ts from "typescript";
import { describe, expect, test } from "vitest";

const ROOT = path.resolve(__dirname, "../../..");
const TEXT_FIELDS = /\b(reason|reasons|description|statistic)\b/;
const STRING_METHODS = new Set(["replace", "replaceAll", "match", "matchAll", "search", "split"]);
const REGEX_METHODS = new Set(["test", "exec"]);

function isRegex(node: ts.Node | undefined): boolean {
  if (!node) return false;
  if (ts.isRegularExpressionLiteral(node)) return true;
  if (ts.isNewExpression(node) || ts.isCallExpression(node)) return ts.isIdentifier(node.expression) && node.expression.text === "RegExp";
  // A constant holding a pattern, e.g. STATISTIC_PATTERN.exec(text).
  return ts.isIdentifier(node) && /(PATTERN|_RE|Re|Regex|regex)$/.test(node.text);
}

/** Places in one source text where a regular expression is applied to a result's text field. */
export function regexOnResultText(fileName: string, source: string): string[] {
  const file = ts.createSourceFile(fileName, source, ts.ScriptTarget.Latest, true, fileName.endsWith("x") ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
  const found: string[] = [];
  const visit = (node: ts.Node): void => {
    if (ts.isCallExpression(node) && ts.isPropertyAccessExpression(node.expression)) {
      const method = node.expression.name.text;
      const receiver = node.expression.expression;
      const args = node.arguments;
      let subject: ts.Node | undefined;
      if (STRING_METHODS.has(method) && (isRegex(args[0]) || method === "match" || method === "matchAll" || method === "search")) subject = receiver;
      if (REGEX_METHODS.has(method) && isRegex(receiver)) subject = args[0];
      if (subject && TEXT_FIELDS.test(subject.getText(file))) {
        const { line } = file.getLineAndCharacterOfPosition(node.getStart(file));
        found.push(`${fileName}:${line + 1}: ${node.getText(file).slice(0, 80)}`);
      }
    }
    ts.forEachChild(node, visit);
  };
  visit(file);
  return found;
}

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) return sources(full);
    return /\.(ts|tsx)$/.test(name) ? [full] : [];
  });
}

describe("no regular expression on a result's text", () => {
  test("the check finds the patterns this rule forbids (parsing a statistic, stripping a reason)", () => {
    const bad = [
      "const m = STATISTIC_PATTERN.exec(rule.statistic.trim());",
      'const general = row.reason.replace(/^[\\d.]+ A < /, "below ");',
      'const x = results.find((r) => r.reason?.match(/accumulates/));',
      'if (/periods from/.test(result.reason ?? "")) n += 1;',
    ];
    for (const line of bad) expect(regexOnResultText("sample.ts", line)).toHaveLength(1);
    expect(regexOnResultText("ok.ts", 'const slug = title.replace(/[^a-z]+/g, "-"); const s = reason.includes("x");')).toEqual([]);
  });

  // Parses every source file of app/ and lib/reports: a generous timeout under load.
  test("lib/reports and app/ hold none", { timeout: 30_000 }, () => {
    const files = [...sources(path.join(ROOT, "lib/reports")), ...sources(path.join(ROOT, "app"))];
    expect(files.length).toBeGreaterThan(10);
    const found = files.flatMap((file) => regexOnResultText(path.relative(ROOT, file), readFileSync(file, "utf8")));
    expect(found).toEqual([]);
  });
});
