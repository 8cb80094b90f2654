/**
 * A measured value or limit for people: about four significant figures, no exponent for the
 * magnitudes met in harmonic work (0.1 mA to 1 MA), "—" when absent or not finite. The one
 * number formatter of the evaluator's reasons, the CLI table, the sheet, the PDF and the CSV.
 * O(1).
 *
 * @example
 * formatNumber(2.30000001) // "2.3"
 * formatNumber(12345.6) // "12346"
 */
export function formatNumber(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return "—";
  if (x === 0) return "0";
  const magnitude = Math.abs(x);
  if (magnitude >= 1e6 || magnitude < 1e-4) return x.toExponential(3);
  if (magnitude >= 1000) return x.toFixed(0);
  return String(Number(x.toPrecision(4)));
}
