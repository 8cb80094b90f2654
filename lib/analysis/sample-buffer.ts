// A growable Float64Array, so a capture of millions of rows is stored as numbers, not row objects.

/**
 * Appends numbers to a Float64Array that doubles when full; amortised O(1) per push.
 * `initialCapacity` can come from an estimate of the row count to avoid regrowth.
 *
 * @example
 * const b = new SampleBuffer(4); b.push(1.5); b.values() // Float64Array [1.5]
 */
export class SampleBuffer {
  private data: Float64Array;
  length = 0;
  /** The numbers are in a SharedArrayBuffer (another thread may read them). */
  readonly shared: boolean;

  /**
   * @param shared back the numbers with a SharedArrayBuffer, so another thread can read them
   *   (a thread holding a view keeps seeing the old numbers once the buffer grows past its capacity).
   */
  constructor(initialCapacity = 1024, shared = false) {
    this.shared = shared;
    this.data = this.allocate(Math.max(16, Math.ceil(initialCapacity)));
  }

  private allocate(capacity: number): Float64Array {
    return this.shared ? new Float64Array(new SharedArrayBuffer(8 * capacity)) : new Float64Array(capacity);
  }

  push(value: number): void {
    if (this.length === this.data.length) {
      const grown = this.allocate(this.data.length * 2);
      grown.set(this.data);
      this.data = grown;
    }
    this.data[this.length++] = value;
  }

  /** Appends the first `count` values of `source` (one copy; grows by doubling). */
  append(source: Float64Array, count: number): void {
    if (this.length + count > this.data.length) {
      let capacity = this.data.length * 2;
      while (capacity < this.length + count) capacity *= 2;
      const grown = this.allocate(capacity);
      grown.set(this.data.subarray(0, this.length));
      this.data = grown;
    }
    this.data.set(source.subarray(0, count), this.length);
    this.length += count;
  }

  /** The whole backing array, filled or not (valid until the buffer grows). */
  storage(): Float64Array {
    return this.data;
  }

  /** The stored values as a view, never a copy (valid until the next push or append). */
  view(): Float64Array {
    return this.data.subarray(0, this.length);
  }

  /** The stored values (a view; trimmed copy when the spare capacity is large). */
  values(): Float64Array {
    return this.length < this.data.length * 0.75 ? this.data.slice(0, this.length) : this.data.subarray(0, this.length);
  }
}
