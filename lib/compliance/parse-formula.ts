// A tiny, closed arithmetic language for limit formulas stored as data (e.g. "0.15*15/h").
// Written as a recursive-descent parser instead of eval/Function or a general expression
// library so that a limit table edited by an admin can never run code or call functions.

/** Variables a limit formula may use: harmonic order, rated power in watts, circuit power factor. */
export const FORMULA_VARIABLES = ["h", "P", "lambda"] as const;
export type FormulaVariable = (typeof FORMULA_VARIABLES)[number];
export type FormulaVariables = Partial<Record<FormulaVariable, number>>;

/** Thrown for a formula that does not parse; `position` is the 1-based character column. */
export class FormulaSyntaxError extends Error {
  readonly position: number;
  readonly formula: string;
  constructor(formula: string, position: number, detail: string) {
    super(`formula "${formula}": ${detail} at position ${position}`);
    this.name = "FormulaSyntaxError";
    this.formula = formula;
    this.position = position;
  }
}

/** Thrown when a formula is evaluated without a value for a variable it uses. */
export class FormulaVariableError extends Error {
  readonly variable: FormulaVariable;
  constructor(formula: string, variable: FormulaVariable) {
    super(`formula "${formula}" needs a value for ${variable}`);
    this.name = "FormulaVariableError";
    this.variable = variable;
  }
}

type Node =
  | { kind: "number"; value: number }
  | { kind: "variable"; name: FormulaVariable }
  | { kind: "negate"; operand: Node }
  | { kind: "binary"; operator: "+" | "-" | "*" | "/" | "^"; left: Node; right: Node };

type Token =
  | { kind: "number"; value: number; position: number; text: string }
  | { kind: "identifier"; name: string; position: number }
  | { kind: "operator"; operator: "+" | "-" | "*" | "/" | "^" | "(" | ")"; position: number }
  | { kind: "end"; position: number };

/** A parsed formula: the variables it uses and a pure evaluation function. */
export interface CompiledFormula {
  source: string;
  variables: FormulaVariable[];
  evaluate(variables: FormulaVariables): number;
}

function isAllowedVariable(name: string): name is FormulaVariable {
  return (FORMULA_VARIABLES as readonly string[]).includes(name);
}

function tokenize(formula: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < formula.length) {
    const ch = formula[i] as string;
    if (ch === " " || ch === "\t") {
      i += 1;
      continue;
    }
    if (/[0-9.]/.test(ch)) {
      const match = /^(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/.exec(formula.slice(i));
      if (!match) throw new FormulaSyntaxError(formula, i + 1, `malformed number`);
      tokens.push({ kind: "number", value: Number(match[0]), position: i + 1, text: match[0] });
      i += match[0].length;
      continue;
    }
    if (/[A-Za-z_]/.test(ch)) {
      const match = /^[A-Za-z_][A-Za-z0-9_]*/.exec(formula.slice(i)) as RegExpExecArray;
      const name = match[0];
      if (!isAllowedVariable(name)) {
        throw new FormulaSyntaxError(
          formula,
          i + 1,
          `unknown identifier "${name}" (allowed: ${FORMULA_VARIABLES.join(", ")})`,
        );
      }
      tokens.push({ kind: "identifier", name, position: i + 1 });
      i += name.length;
      continue;
    }
    if ("+-*/^()".includes(ch)) {
      tokens.push({ kind: "operator", operator: ch as "+", position: i + 1 });
      i += 1;
      continue;
    }
    throw new FormulaSyntaxError(formula, i + 1, `unexpected character "${ch}"`);
  }
  tokens.push({ kind: "end", position: formula.length + 1 });
  return tokens;
}

// Grammar (usual precedence, ^ right-associative and binding tighter than unary minus):
//   expr   := term (("+" | "-") term)*
//   term   := unary (("*" | "/") unary)*
//   unary  := "-" unary | "+" unary | power
//   power  := atom ("^" unary)?
//   atom   := number | variable | "(" expr ")"
/** Longest formula accepted, characters: a limit formula is a short expression. */
export const MAX_FORMULA_LENGTH = 2000;
/** Deepest nesting accepted (parentheses, unary signs and powers, counted together). */
export const MAX_FORMULA_DEPTH = 64;

function parseTokens(formula: string, tokens: Token[]): Node {
  let index = 0;
  // The parser recurses once per nesting level: a cap keeps hostile input (10,000 "(" or
  // 100,000 unary "-") a syntax error instead of a stack overflow.
  let depth = 0;
  const nested = <T>(position: number, parse: () => T): T => {
    depth += 1;
    if (depth > MAX_FORMULA_DEPTH) throw new FormulaSyntaxError(formula, position, `nested more than ${MAX_FORMULA_DEPTH} levels deep`);
    try {
      return parse();
    } finally {
      depth -= 1;
    }
  };
  const peek = (): Token => tokens[index] as Token;
  const isOperator = (token: Token, operator: string): boolean =>
    token.kind === "operator" && token.operator === operator;
  const describe = (token: Token): string =>
    token.kind === "end"
      ? "unexpected end of formula"
      : token.kind === "number"
        ? `unexpected number "${token.text}"`
        : token.kind === "identifier"
          ? `unexpected identifier "${token.name}"`
          : `unexpected "${token.operator}"`;

  // A left-associative level of the grammar: operand (operator operand)*.
  const leftAssociative = (operators: ReadonlyArray<"+" | "-" | "*" | "/">, operand: () => Node) => (): Node => {
    let left = operand();
    for (;;) {
      const token = peek();
      const operator = token.kind === "operator" ? operators.find((o) => o === token.operator) : undefined;
      if (!operator) return left;
      index += 1;
      left = { kind: "binary", operator, left, right: operand() };
    }
  };
  const term = leftAssociative(["*", "/"], () => unary());
  const expr = leftAssociative(["+", "-"], term);
  const unary = (): Node => {
    const token = peek();
    if (isOperator(token, "-")) {
      index += 1;
      return { kind: "negate", operand: nested(token.position, unary) };
    }
    if (isOperator(token, "+")) {
      index += 1;
      return nested(token.position, unary);
    }
    return power();
  };
  const power = (): Node => {
    const base = atom();
    const caret = peek();
    if (isOperator(caret, "^")) {
      index += 1;
      return { kind: "binary", operator: "^", left: base, right: nested(caret.position, unary) };
    }
    return base;
  };
  const atom = (): Node => {
    const token = peek();
    if (token.kind === "number") {
      index += 1;
      return { kind: "number", value: token.value };
    }
    if (token.kind === "identifier") {
      index += 1;
      return { kind: "variable", name: token.name as FormulaVariable };
    }
    if (isOperator(token, "(")) {
      index += 1;
      const inner = nested(token.position, expr);
      const close = peek();
      if (!isOperator(close, ")")) {
        throw new FormulaSyntaxError(formula, close.position, `expected ")" but found ${describe(close).replace("unexpected ", "")}`);
      }
      index += 1;
      return inner;
    }
    throw new FormulaSyntaxError(formula, token.position, describe(token));
  };

  const root = expr();
  const rest = peek();
  if (rest.kind !== "end") throw new FormulaSyntaxError(formula, rest.position, describe(rest));
  return root;
}

function collectVariables(node: Node, into: Set<FormulaVariable>): void {
  if (node.kind === "variable") into.add(node.name);
  else if (node.kind === "negate") collectVariables(node.operand, into);
  else if (node.kind === "binary") {
    collectVariables(node.left, into);
    collectVariables(node.right, into);
  }
}

function evaluateNode(formula: string, node: Node, variables: FormulaVariables): number {
  switch (node.kind) {
    case "number":
      return node.value;
    case "variable": {
      const value = variables[node.name];
      if (value === undefined || !Number.isFinite(value)) throw new FormulaVariableError(formula, node.name);
      return value;
    }
    case "negate":
      return -evaluateNode(formula, node.operand, variables);
    case "binary": {
      const left = evaluateNode(formula, node.left, variables);
      const right = evaluateNode(formula, node.right, variables);
      if (node.operator === "+") return left + right;
      if (node.operator === "-") return left - right;
      if (node.operator === "*") return left * right;
      if (node.operator === "/") return left / right;
      return left ** right;
    }
  }
}

/**
 * Parse a limit formula into a pure evaluator, validating it completely up front.
 *
 * Language: decimal numbers (with optional exponent), the variables `h` (harmonic order),
 * `P` (rated power, W) and `lambda` (circuit power factor), `+ - * / ^`, unary minus and
 * parentheses. Anything else — other identifiers, function calls, `;`, quotes — is a
 * {@link FormulaSyntaxError} naming the 1-based character position, as is a formula longer than
 * {@link MAX_FORMULA_LENGTH} characters or nested deeper than {@link MAX_FORMULA_DEPTH} levels.
 * Runs in O(length).
 *
 * @example
 * parseFormula("0.15*15/h").evaluate({ h: 21 }) // ≈ 0.1071 (amperes, IEC 61000-3-2 Class A)
 * parseFormula("0.15*15/x") // throws: formula "0.15*15/x": unknown identifier "x" (allowed: h, P, lambda) at position 9
 */
export function parseFormula(formula: string): CompiledFormula {
  if (formula.trim() === "") throw new FormulaSyntaxError(formula, 1, "empty formula");
  if (formula.length > MAX_FORMULA_LENGTH) {
    throw new FormulaSyntaxError(formula.slice(0, 40) + "…", MAX_FORMULA_LENGTH + 1, `longer than ${MAX_FORMULA_LENGTH} characters (${formula.length})`);
  }
  const root = parseTokens(formula, tokenize(formula));
  const used = new Set<FormulaVariable>();
  collectVariables(root, used);
  const variables = FORMULA_VARIABLES.filter((name) => used.has(name));
  return {
    source: formula,
    variables,
    evaluate: (values) => evaluateNode(formula, root, values),
  };
}
