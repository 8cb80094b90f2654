// The 14 standard PDF fonts only cover WinAnsi; map the few symbols the evaluator's wording uses
// and replace anything else rather than print a wrong glyph.
const replacements: Record<string, string> = { "λ": "lambda", "≤": "<=", "≥": ">=", "≈": "~", "Σ": "sum", "√": "sqrt", "−": "-", "→": "->", "′": "'", "μ": "µ", "Ω": "ohm" };
const winAnsiExtra = new Set("€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ");

/**
 * Text as the standard fonts can print it: printable ASCII, Latin-1 and the WinAnsi extras pass,
 * λ ≤ ≥ ≈ Σ √ − → ′ μ Ω become words or look-alikes, anything else "?". O(length).
 *
 * @example pdfSafe("λ ≥ 0.9") // "lambda >= 0.9"
 */
export function pdfSafe(text: string): string {
  let out = "";
  for (const ch of text) {
    const code = ch.codePointAt(0) ?? 0;
    if ((code >= 0x20 && code <= 0x7e) || (code >= 0xa0 && code <= 0xff) || winAnsiExtra.has(ch) || ch === "\n") out += ch;
    else out += replacements[ch] ?? "?";
  }
  return out;
}
