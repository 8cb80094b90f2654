/**
 * A measured value or limit for people: `significant` figures (four unless a caller asks for fewer,
 * as the what-if predictions do), no trailing zeros, no exponent for the magnitudes met in harmonic
 * work (0.1 mA to 1 MA; whole numbers from 1000 up), "—" when absent or not finite. The one number
 * formatter of the evaluator's reasons, the CLI table, the sheet, the PDF, the CSV and the
 * mitigation studies. O(1).
 *
 * @example
 * formatNumber(2.30000001) // "2.3"
 * formatNumber(12345.6) // "12346"
 * formatNumber(0.061234, 3) // "0.0612"
 */
export function formatNumber(x: number | null | undefined, significant = 4): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return "—";
  if (x === 0) return "0";
  const magnitude = Math.abs(x);
  if (magnitude >= 1e6 || magnitude < 1e-4) return x.toExponential(significant - 1);
  if (magnitude >= 1000) return x.toFixed(0);
  return String(Number(x.toPrecision(significant)));
}
