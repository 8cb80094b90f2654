// Splits a header's name into whole tokens, so recognition matches words and never substrings.

/** One token of a header name. */
export interface HeaderToken {
  /** As written, e.g. "IL", "1", "Load". */
  text: string;
  /** Lower case, for matching. */
  lower: string;
  /** True for a run of digits. */
  numeric: boolean;
}

const TOKEN = /[A-Z]+(?![a-z])|[A-Z]?[a-z]+|[0-9]+|[µμ]+/g;

/**
 * Splits on everything that is not a letter or digit (spaces, `_`, `-`, brackets, dots), on case
 * changes (camelCase and "ILoad" → "I", "Load") and between letters and digits ("IL1" → "IL", "1";
 * "h05" → "h", "05"). An upper-case run followed by lower case keeps its last capital with the
 * word ("Ia", "Van" stay whole: a quantity letter with its phase).
 *
 * Complexity O(length).
 *
 * @example
 * tokenizeHeader("i_load").map((t) => t.text)          // ["i", "load"]
 * tokenizeHeader("VoltagePhaseA").map((t) => t.text)   // ["Voltage", "Phase", "A"]
 * tokenizeHeader("UL1-N").map((t) => t.text)           // ["UL", "1", "N"]
 */
export function tokenizeHeader(name: string): HeaderToken[] {
  const tokens: HeaderToken[] = [];
  for (const match of name.matchAll(TOKEN)) {
    const text = match[0];
    tokens.push({ text, lower: text.toLowerCase(), numeric: /^[0-9]+$/.test(text) });
  }
  return tokens;
}
