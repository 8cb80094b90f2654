// Where a record's sample interval comes from: the one decision for the in-memory and streaming paths.
import { AnalysisInputError } from "./errors";
import type { AnalysisResult } from "./types";

/** The interval in seconds and where it came from. */
export interface SampleIntervalChoice {
  sampleIntervalS: number;
  sampleIntervalSource: NonNullable<AnalysisResult["sampleIntervalSource"]>;
}

/**
 * Chooses the sample interval: the user's value when given (it overrides the file), else the
 * least-squares fit of the time column when there is one, else the interval or rate stated in the
 * preamble. The time column's fit is only run when it is the source (it throws for a broken axis).
 *
 * Complexity: that of `fromTimeColumn` when it is used, else O(1).
 *
 * @param givenS the user's interval in seconds, or undefined.
 * @param fromTimeColumn fits the time column and returns its interval in seconds (null: no time column).
 * @param statedS the preamble's interval in seconds, or null.
 * @throws AnalysisInputError "invalid-option" for a given interval that is not a positive number,
 *   "no-sample-interval" when there is no source at all.
 * @example
 * chooseSampleInterval(undefined, null, 1 / 6400) // { sampleIntervalS: 0.00015625, sampleIntervalSource: "preamble" }
 */
export function chooseSampleInterval(givenS: number | undefined, fromTimeColumn: (() => number) | null, statedS: number | null): SampleIntervalChoice {
  if (givenS !== undefined) {
    if (!(givenS > 0) || !Number.isFinite(givenS)) {
      throw new AnalysisInputError("invalid-option", `sample interval must be a positive number of seconds, got ${givenS}`);
    }
    return { sampleIntervalS: givenS, sampleIntervalSource: "option" };
  }
  if (fromTimeColumn) return { sampleIntervalS: fromTimeColumn(), sampleIntervalSource: "time-column" };
  if (statedS !== null) return { sampleIntervalS: statedS, sampleIntervalSource: "preamble" };
  throw new AnalysisInputError(
    "no-sample-interval",
    "no sample interval: the file has no time column and its preamble states no sample interval or rate (give the interval in seconds)",
  );
}
