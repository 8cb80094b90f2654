// Windows cut from whole channels held in arrays: the in-memory path's, and the analysis helper
// thread's (which reads the rows pass 1 kept).
import type { WindowSource } from "./window-analyzer";

/**
 * A {@link WindowSource} over channels held whole: sample j of channel c is `samples[j] · scale`;
 * indices before the record's start or past its end (`n` samples) are folded back by the
 * window's period, the way the in-memory path always did.
 *
 * Complexity O(span) per copied window.
 *
 * @example
 * const source = arrayWindowSource([{ samples: va, scale: 1 }], va.length);
 * source.copyWindow(0, -3, 1286, 1280, target);
 */
export function arrayWindowSource(channels: readonly { samples: ArrayLike<number>; scale: number }[], n: number): WindowSource {
  return {
    copyWindow(ci, first, span, period, target) {
      const { samples, scale } = channels[ci]!;
      for (let k = 0; k < span; k++) {
        let j = first + k;
        while (j < 0) j += period;
        while (j >= n) j -= period;
        if (j < 0) j = 0;
        target[k] = samples[j]! * scale;
      }
    },
  };
}
