// Expected failures of a capture's set-up (not of its file), each with a code and the words a
// technician can act on.

export type CaptureSetupErrorCode = "no-limit-set";

const MESSAGES: Record<CaptureSetupErrorCode, string> = {
  "no-limit-set": "Choose a limit set in the mapping form, then run the analysis again.",
};

/**
 * A capture cannot be processed until its set-up is completed; `code` says what is missing and
 * `message` is the sentence shown as the capture's failure reason.
 *
 * @example
 * throw new CaptureSetupError("no-limit-set");
 */
export class CaptureSetupError extends Error {
  readonly code: CaptureSetupErrorCode;
  constructor(code: CaptureSetupErrorCode) {
    super(MESSAGES[code]);
    this.name = "CaptureSetupError";
    this.code = code;
  }
}
