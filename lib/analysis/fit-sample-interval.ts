// Derives the sample interval from a time column and rejects time axes that are not a regular grid.
import { AnalysisInputError } from "./errors";
import { LineFit } from "./line-fit";

/** Result of fitting t_i = startS + i·intervalS. */
export interface TimeAxisFit {
  intervalS: number;
  startS: number;
  /** Largest |residual| of the fit in seconds. */
  maxResidualS: number;
}

/**
 * The error for a time stamp smaller than the one before it: the time axis runs backwards there.
 * One wording for the in-memory and streaming paths and the preview.
 *
 * @example
 * backwardsTimeError(702, 1, 0.05, 0.1093).message // "time axis runs backwards at line 702: 0.05 s follows 0.1093 s (not monotonic)"
 */
export function backwardsTimeError(line: number, column: number, timeS: number, previousS: number): AnalysisInputError {
  return new AnalysisInputError("non-monotonic-time", `time axis runs backwards at line ${line}: ${timeS} s follows ${previousS} s (not monotonic)`, {
    line,
    column,
  });
}

/** How far a stamp may stray, said in every irregular-time message. */
const TOLERANCE_WORDS = "(tolerance ±50 % of the interval plus the stamps' printed resolution)";

/** A step between two stamps too far from the interval (a dropped or repeated sample): the first one stops the analysis. */
export function irregularStepError(line: number, column: number, stepS: number, intervalS: number): AnalysisInputError {
  return new AnalysisInputError(
    "irregular-time",
    `irregular time axis at line ${line}: step of ${stepS.toPrecision(4)} s where the interval is ${intervalS.toPrecision(4)} s ${TOLERANCE_WORDS}`,
    { line, column },
  );
}

/** A stamp too far from the whole record's regular grid. */
export function offGridError(line: number, column: number, timeS: number, residualS: number, intervalS: number): AnalysisInputError {
  return new AnalysisInputError(
    "irregular-time",
    `irregular time axis at line ${line}: time stamp ${timeS} s is ${residualS.toPrecision(3)} s off the regular grid of ${intervalS.toPrecision(4)} s ${TOLERANCE_WORDS}`,
    { line, column },
  );
}

/**
 * Least-squares fit of t_i = a + b·i over the whole time column. Printed time stamps are rounded,
 * so neighbouring differences are noisy; the slope of the fit is the interval.
 * The axis must increase (a decreasing stamp is "non-monotonic") and every step and every residual
 * must stay within the jitter tolerance: ±50 % of the interval plus the printed resolution of the
 * stamps (`resolutionS`), else "irregular" (a dropped sample makes a step of 2 intervals).
 *
 * Complexity O(n), two passes.
 *
 * @param timesS time stamps in seconds, one per data row.
 * @param resolutionS the smallest step the printed stamps can show (0 when unknown).
 * @param lineOfRow maps a row index to its 1-based line number in the file, for messages.
 * @param column 1-based column of the time axis, for messages.
 * @throws AnalysisInputError "non-monotonic-time" or "irregular-time".
 * @example
 * fitSampleInterval(Float64Array.from([0, 0.001, 0.002]), 0, (i) => i + 2, 1).intervalS // 0.001
 */
export function fitSampleInterval(
  timesS: Float64Array,
  resolutionS: number,
  lineOfRow: (row: number) => number,
  column: number,
): TimeAxisFit {
  const n = timesS.length;
  if (n < 2) {
    throw new AnalysisInputError("too-short", "record is shorter than one analysis window: it has fewer than two samples");
  }
  for (let i = 1; i < n; i++) {
    if (timesS[i]! < timesS[i - 1]!) throw backwardsTimeError(lineOfRow(i), column, timesS[i]!, timesS[i - 1]!);
  }
  const fit = new LineFit();
  for (let i = 0; i < n; i++) fit.add(i, timesS[i]!);
  const intervalS = fit.slope();
  if (!(intervalS > 0)) {
    throw new AnalysisInputError("irregular-time", `time axis does not advance: every time stamp from line ${lineOfRow(0)} on is ${timesS[0]} s`, {
      line: lineOfRow(0),
      column,
    });
  }
  const startS = fit.intercept();
  const tolerance = 0.5 * intervalS + resolutionS;
  for (let i = 1; i < n; i++) {
    const step = timesS[i]! - timesS[i - 1]!;
    if (Math.abs(step - intervalS) > tolerance) throw irregularStepError(lineOfRow(i), column, step, intervalS);
  }
  let maxResidualS = 0;
  for (let i = 0; i < n; i++) {
    const residual = Math.abs(timesS[i]! - (startS + intervalS * i));
    if (residual > tolerance) throw offGridError(lineOfRow(i), column, timesS[i]!, residual, intervalS);
    if (residual > maxResidualS) maxResidualS = residual;
  }
  return { intervalS, startS, maxResidualS };
}
