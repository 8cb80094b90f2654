// Where consecutive analysis windows start when the fundamental is measured per segment.

/** Longest window allowed to extend past the record, as a fraction of a window (IEC 61000-4-7 sync tolerance is ±0.03 %). */
export const WINDOW_FIT_TOLERANCE = 1e-3;

/**
 * Walks the windows of a record: consecutive, each `windowSamples[k]` samples long (whole cycles
 * of segment k's fundamental) where k is the segment holding the window's start. Within a segment
 * starts are anchor + i·length (no accumulated rounding); a window whose start crosses into the
 * next segment anchors that segment. With one segment this is exactly w·length, w < ⌊n/length + 0.001⌋.
 *
 * Complexity O(1) per window.
 *
 * @param bounds segment starts plus the record length at the end ([0, n] for one segment).
 * @param windowSamples window length in samples per segment.
 * @example
 * const s = new WindowSchedule([0, 12800], [1280]); while (!s.done) { use(s.start, s.windowSamples); s.advance(); }
 */
export class WindowSchedule {
  start = 0;
  windowSamples: number;
  done = false;
  private segment = 0;
  private anchor = 0;
  private index = 0;
  private readonly n: number;

  constructor(
    private readonly bounds: number[],
    private readonly lengths: number[],
  ) {
    this.n = bounds[bounds.length - 1]!;
    this.windowSamples = lengths[0]!;
    this.update();
  }

  private update(): void {
    const length = this.lengths[this.segment]!;
    this.windowSamples = length;
    this.start = this.anchor + this.index * length;
    this.done = !(this.index + 1 <= (this.n - this.anchor) / length + WINDOW_FIT_TOLERANCE);
  }

  advance(): void {
    this.index++;
    const next = this.anchor + this.index * this.lengths[this.segment]!;
    if (this.segment + 2 < this.bounds.length && next >= this.bounds[this.segment + 1]!) {
      this.segment++;
      this.anchor = next;
      this.index = 0;
    }
    this.update();
  }
}

/**
 * Splits a record of `n` samples into frequency segments of `segmentSamples`; the last segment
 * takes the remainder (so it holds between one and two segments' worth). Returns the starts plus n.
 *
 * @example
 * segmentBounds(10, 4) // [0, 4, 10]
 */
export function segmentBounds(n: number, segmentSamples: number): number[] {
  const count = Math.max(1, Math.floor(n / segmentSamples));
  const bounds = Array.from({ length: count }, (_, k) => k * segmentSamples);
  bounds.push(n);
  return bounds;
}
