// The windows of a record shared out between the main thread and the analysis helper thread while
// both measure them: the main thread takes them from the front, in order, as pass 2 brings their
// samples in; the helper takes them from the back. Whichever is quicker takes more.

/**
 * Windows 0 … count − 1 in shared memory, claimed one at a time from the front by one thread and
 * from the back by another, each window by exactly one of them. The front and the back are held
 * in one 64-bit cell changed by compare-and-swap, so a claim never races with the other end's.
 *
 * After both ends have stopped (a claim came back −1), the windows below {@link boundary} were
 * taken from the front and the others from the back.
 *
 * Complexity O(1) per claim (a few atomic operations).
 *
 * @example
 * const claims = WindowClaims.create(300); claims.takeFront() // 0; claims.takeBack() // 299
 */
export class WindowClaims {
  constructor(
    /** One cell: front in the low 32 bits, back in the high 32 (SharedArrayBuffer-backed to share it). */
    readonly cell: BigInt64Array,
  ) {}

  /** Claims for `count` windows, in shared memory. */
  static create(count: number): WindowClaims {
    const cell = new BigInt64Array(new SharedArrayBuffer(8));
    cell[0] = BigInt(count) << 32n;
    return new WindowClaims(cell);
  }

  private claim(fromFront: boolean): number {
    for (;;) {
      const old = Atomics.load(this.cell, 0);
      const front = Number(old & 0xffffffffn);
      const back = Number(old >> 32n);
      if (front >= back) return -1;
      const next = fromFront ? (BigInt(back) << 32n) | BigInt(front + 1) : (BigInt(back - 1) << 32n) | BigInt(front);
      if (Atomics.compareExchange(this.cell, 0, old, next) === old) return fromFront ? front : back - 1;
    }
  }

  /** The next window from the front, or −1 when none is left. */
  takeFront(): number {
    return this.claim(true);
  }

  /** The next window from the back, or −1 when none is left. */
  takeBack(): number {
    return this.claim(false);
  }

  /** The first window not taken from the front (final once both ends have stopped). */
  get boundary(): number {
    return Number(Atomics.load(this.cell, 0) & 0xffffffffn);
  }
}
