// The one error type the analysis engine throws for bad input; anything else is a bug.

/** Machine-readable reason for an {@link AnalysisInputError}. */
export type AnalysisErrorCode =
  | "empty-file"
  | "no-numeric-columns"
  | "non-numeric-cell"
  | "value-out-of-range"
  | "ragged-row"
  | "non-monotonic-time"
  | "irregular-time"
  | "no-sample-interval"
  | "too-short"
  | "sample-rate-too-low"
  | "constant-channel"
  | "no-channels"
  | "frequency-out-of-range"
  | "invalid-option"
  | "unknown-column"
  | "unreadable-file";

/** Where in the source file a problem was found (both 1-based). */
export interface InputLocation {
  line?: number;
  column?: number;
}

/**
 * A problem with the capture or the options, worded for the person who uploaded it.
 * `line` and `column` are 1-based positions in the CSV file when the problem has one.
 *
 * @example
 * throw new AnalysisInputError("non-numeric-cell", 'line 12, column 3 (Ia): "abc" is not a number', { line: 12, column: 3 });
 */
export class AnalysisInputError extends Error {
  readonly code: AnalysisErrorCode;
  readonly line?: number;
  readonly column?: number;

  constructor(code: AnalysisErrorCode, message: string, location: InputLocation = {}) {
    super(message);
    this.name = "AnalysisInputError";
    this.code = code;
    if (location.line !== undefined) this.line = location.line;
    if (location.column !== undefined) this.column = location.column;
  }
}

/**
 * Type guard for {@link AnalysisInputError}, for callers that must tell input problems from bugs.
 *
 * @example
 * try { analyzeCsvText(text) } catch (e) { if (isAnalysisInputError(e)) console.error(e.message) }
 */
export function isAnalysisInputError(error: unknown): error is AnalysisInputError {
  return error instanceof AnalysisInputError;
}
