// Window boundaries from the tracked phase, against the analytic boundaries of a linear frequency ramp.
import { expect, test } from "vitest";
import { PhaseTracker } from "@/lib/analysis/phase-tracker";
import { scheduleWindows } from "@/lib/analysis/schedule-windows";
import { mulberry32, rampingMultiTone } from "./signals";

test("each window ends where the ramping fundamental has turned exactly 10 more cycles (IEC 61000-4-7:2002+A1:2008 §4.4, from memory)", () => {
  // f(t) = 49.85 + 0.03·t Hz, so the phase in cycles is Θ(t) = 49.85·t + 0.015·t² (its integral);
  // window w ends at the root of Θ(t) = 10·w: t = (−49.85 + √(49.85² + 4·0.015·10·w)) / (2·0.015).
  const rate = 6400;
  const amplitudes = [0, 100, 0, 12, 0, 8, 0, 5];
  const phases = [0, 0, 0, 1, 0, 2, 0, 0.5];
  const samples = rampingMultiTone(49.85, 0.3, rate, 10, amplitudes, phases);
  const tracker = new PhaseTracker();
  // Fed in two uneven chunks with a carrier 0.1 Hz off: the track does not depend on either.
  tracker.feed(samples.subarray(0, 20_001), 20_001, 49.9 / rate);
  tracker.feed(samples.subarray(20_001), samples.length - 20_001, 50.1 / rate);
  const bounds = scheduleWindows(tracker.finish(), 10, samples.length);
  // 10 s of a ramp averaging 50 Hz hold 500 cycles: 50 windows, the last ending at the record's end.
  expect(bounds.length - 1).toBe(50);
  const endSample = (w: number): number => ((-49.85 + Math.sqrt(49.85 ** 2 + 4 * 0.015 * 10 * w)) / (2 * 0.015)) * rate;
  for (let w = 1; w <= 50; w++) {
    // Every boundary within 0.1 sample (16 µs; IEC 61000-4-7 allows ±0.03 % of the 200 ms window = 60 µs).
    expect(Math.abs(bounds[w]! - endSample(w)), `window ${w} end`).toBeLessThan(0.1);
    // Every window's length within 0.002 sample except the first and last (their outer ends are extended beyond the first and last block centres).
    if (w > 1 && w < 50) expect(Math.abs(bounds[w]! - bounds[w - 1]! - (endSample(w) - endSample(w - 1))), `window ${w} length`).toBeLessThan(0.002);
  }
});

test("a current that stops for a second: the windows after it are back on the fundamental's cycles", () => {
  // 50 Hz at 6400 S/s (128 samples per cycle, so window w ends at sample 1280·w), off from 1.5 s to 2.5 s
  // with a noise of 10⁻⁴ of the amplitude; the carrier is given 0.05 Hz high.
  const rate = 6400;
  const rnd = mulberry32(11);
  const samples = Float64Array.from({ length: 4 * rate }, (_, k) =>
    k >= 1.5 * rate && k < 2.5 * rate ? 1e-4 * (rnd() - 0.5) : 10 * Math.cos((2 * Math.PI * 50 * k) / rate + 0.4) + 1.5 * Math.cos((2 * Math.PI * 250 * k) / rate),
  );
  const tracker = new PhaseTracker();
  tracker.feed(samples, samples.length, 50.05 / rate);
  const bounds = scheduleWindows(tracker.finish(), 10, samples.length);
  expect(bounds.length - 1).toBe(20);
  for (let w = 1; w <= 20; w++) {
    const offset = Math.abs(bounds[w]! - 1280 * w);
    // Through the gap the phase follows the carrier (0.05 Hz × 1 s = 0.05 cycle = 6.4 samples at most).
    expect(offset, `window ${w} end`).toBeLessThan(w * 1280 <= 1.4 * rate || w * 1280 >= 2.7 * rate ? 0.05 : 8);
  }
});
