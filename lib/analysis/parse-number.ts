// Strict number parsing for CSV cells: fast (native Number) and rejects what parseFloat would half-accept.

/**
 * Parses one CSV cell as a finite number; returns NaN when the cell is not a number.
 * With `decimalComma`, "1,5" reads as 1.5 (the delimiter is then `;` or tab).
 * Unlike `parseFloat`, trailing junk ("1.5abc"), empty cells, "NaN" and "Infinity" are rejected.
 *
 * Complexity O(length of the cell).
 *
 * @example
 * parseNumber("-1.5e-3", false) // -0.0015
 * parseNumber("2,25", true)     // 2.25
 * parseNumber("abc", false)     // NaN
 */
export function parseNumber(cell: string, decimalComma: boolean): number {
  if (cell.length === 0) return Number.NaN;
  const text = decimalComma && cell.indexOf(",") !== -1 ? cell.replace(",", ".") : cell;
  const value = Number(text);
  if (!Number.isFinite(value)) return Number.NaN;
  // Number() reads blank text as 0 and accepts hex/binary literals; a data cell must hold a decimal number.
  if (value === 0 && !/[0-9]/.test(text)) return Number.NaN;
  const c = text.charCodeAt(text.length - 1);
  if (!((c >= 48 && c <= 57) || c === 46 || c === 32 || c === 9 || c === 13)) return Number.NaN;
  if (text.length > 2 && text.charCodeAt(0) === 48) {
    const prefix = text.charCodeAt(1) | 0x20; // "0x1f", "0b1", "0o7"
    if (prefix === 120 || prefix === 98 || prefix === 111) return Number.NaN;
  }
  return value;
}
