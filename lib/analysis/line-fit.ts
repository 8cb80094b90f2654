// The one least-squares straight line of the analysis: time axes (interval from stamps) and the
// fundamental's phase regression both use it.

/**
 * Running ordinary least-squares fit of y = intercept + slope·x, fed one point at a time.
 * Keeps the means and the co-moments about them (Welford's updates), relative to the first point,
 * so neither a long record (10^7 points) nor a large offset (time stamps of 10^5 s) cancels digits
 * the way Σx², Σxy sums would; a batch and a chunked feed of the same points give the same line.
 *
 * Units: slope in y-units per x-unit, intercept in y-units. Complexity O(1) per point, O(1) memory.
 *
 * @example
 * const fit = new LineFit(); for (const [x, y] of [[0, 1], [1, 3], [2, 4], [3, 8]]) fit.add(x, y);
 * fit.slope() // 2.2
 * fit.intercept() // 0.7
 */
export class LineFit {
  count = 0;
  /** The first point: the others are taken relative to it, so large offsets cost no digits. */
  private originX = 0;
  private originY = 0;
  private meanX = 0;
  private meanY = 0;
  private cxx = 0;
  private cxy = 0;

  add(xValue: number, yValue: number): void {
    if (this.count === 0) {
      this.originX = xValue;
      this.originY = yValue;
    }
    const x = xValue - this.originX;
    const y = yValue - this.originY;
    this.count++;
    const dx = x - this.meanX;
    this.meanX += dx / this.count;
    this.meanY += (y - this.meanY) / this.count;
    // Co-moments with the updated means (Welford): exact in exact arithmetic, no cancellation.
    this.cxx += dx * (x - this.meanX);
    this.cxy += dx * (y - this.meanY);
  }

  /** Σ(x − x̄)(y − ȳ) / Σ(x − x̄)²; NaN with fewer than two distinct x. */
  slope(): number {
    return this.cxy / this.cxx;
  }

  /** ȳ − slope·x̄: the line's value at x = 0. */
  intercept(): number {
    return this.originY + this.meanY - this.slope() * (this.originX + this.meanX);
  }
}
