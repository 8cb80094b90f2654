// The analysis options a caller can get wrong, checked once for both paths.
import { AnalysisInputError } from "./errors";
import type { AnalysisOptions } from "./types";

function fail(code: "invalid-option", message: string): never {
  throw new AnalysisInputError(code, message);
}

/**
 * Refuses analysis options out of range: nominal frequency (50/60 Hz), max order (1–100), THD
 * max order (40/50), IL and Iref (positive A), sample interval (positive s), frequency segment
 * (integer ≥ 4096 samples), each with a message naming the option and the value.
 *
 * Complexity O(1).
 *
 * @throws AnalysisInputError "invalid-option".
 * @example
 * checkOptions({ frequencyHz: 55 }) // throws "frequency must be 50 or 60 Hz, got 55"
 */
export function checkOptions(options: AnalysisOptions): void {
  const { frequencyHz, maxOrder, thdMaxOrder, ilA, irefA } = options;
  if (frequencyHz !== undefined && frequencyHz !== 50 && frequencyHz !== 60) fail("invalid-option", `frequency must be 50 or 60 Hz, got ${frequencyHz}`);
  if (maxOrder !== undefined && !(Number.isInteger(maxOrder) && maxOrder >= 1 && maxOrder <= 100)) {
    fail("invalid-option", `max order must be an integer from 1 to 100, got ${maxOrder}`);
  }
  if (thdMaxOrder !== undefined && thdMaxOrder !== 40 && thdMaxOrder !== 50) fail("invalid-option", `THD max order must be 40 or 50, got ${thdMaxOrder}`);
  if (ilA !== undefined && !(ilA > 0 && Number.isFinite(ilA))) fail("invalid-option", `IL must be a positive current in A, got ${ilA}`);
  if (irefA !== undefined && !(irefA > 0 && Number.isFinite(irefA))) fail("invalid-option", `Iref must be a positive current in A, got ${irefA}`);
  if (options.sampleIntervalS !== undefined && !(options.sampleIntervalS > 0 && Number.isFinite(options.sampleIntervalS))) {
    fail("invalid-option", `sample interval must be a positive number of seconds, got ${options.sampleIntervalS}`);
  }
  const segment = options.frequencySegmentSamples;
  if (segment !== undefined && !(Number.isInteger(segment) && segment >= 4096)) {
    fail("invalid-option", `frequency segment must be an integer of at least 4096 samples, got ${segment}`);
  }
}
