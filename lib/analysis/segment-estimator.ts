// The fundamental of each frequency segment of a streamed record and its phase through the segment,
// per estimation channel: pass 1's measuring (see stream-first-pass.ts), run in the main thread or
// in the analysis helper thread (analysis-helper-thread.ts) — the same code either way.
import { AnalysisInputError } from "./errors";
import { estimateFundamental } from "./estimate-fundamental";
import { PhaseTracker } from "./phase-tracker";

/**
 * Measures segment after segment, in order: the fundamental of each (as f / provisional rate, or
 * the AnalysisInputError that channel gave — kept, and thrown later only if that channel is the
 * reference), then feeds the segment to the channel's phase tracker at that carrier. A channel
 * that failed once is not measured again; without a usable rate the ratio is NaN (the error is
 * reported after pass 1).
 *
 * Complexity per segment O(n log n) for the coarse transform plus O(n) refinement and tracking.
 *
 * @example
 * const estimator = new SegmentEstimator(1);
 * estimator.estimate([segment], segment.length, 25_600); estimator.ratios[0] // [0.001954…]
 */
export class SegmentEstimator {
  /** f / provisional rate per segment, per estimation channel (errors kept). */
  readonly ratios: (number | AnalysisInputError)[][];
  /** The fundamental's phase through the record, per estimation channel. */
  readonly trackers: PhaseTracker[];
  /** Milliseconds spent measuring. */
  fundamentalMs = 0;

  constructor(channels: number) {
    this.ratios = Array.from({ length: channels }, () => []);
    this.trackers = Array.from({ length: channels }, () => new PhaseTracker());
  }

  /** Measures the next segment: `segments[e]` holds its first `length` samples of estimation channel e. */
  estimate(segments: Float64Array[], length: number, provisionalRateHz: number): void {
    const started = performance.now();
    for (let e = 0; e < this.ratios.length; e++) {
      const list = this.ratios[e]!;
      if (list.some((r) => r instanceof AnalysisInputError)) continue;
      if (!(provisionalRateHz > 0)) {
        list.push(Number.NaN);
        continue;
      }
      try {
        const segment = segments[e]!.subarray(0, length);
        const ratio = estimateFundamental(segment, provisionalRateHz) / provisionalRateHz;
        list.push(ratio);
        this.trackers[e]!.feed(segment, length, ratio);
      } catch (error) {
        if (!(error instanceof AnalysisInputError)) throw error;
        list.push(error);
      }
    }
    this.fundamentalMs += performance.now() - started;
  }
}
