// Keeps the first few cycles of each channel for a waveform chart while samples stream past.
import type { WaveformExcerpt } from "./types";

/** Points per channel at most in a waveform excerpt. */
export const WAVEFORM_MAX_POINTS = 600;

/**
 * Collects samples 0, step, 2·step, … below `count` = ⌈cycles / fundamental / interval⌉ (capped at
 * the record length), step = ⌈count / 600⌉, from chunks of rows — the same points the web worker
 * has always taken from an in-memory capture.
 *
 * Complexity O(1) per kept point; memory ≤ 600 numbers per channel.
 *
 * @example
 * const w = new WaveformCollector(3, 50, 1 / 6400, rows, [{ name: "Ia", unit: "A" }]);
 * w.add([samples], samples.length, 0); w.result().timeS.length // 384
 */
export class WaveformCollector {
  private readonly count: number;
  private readonly step: number;
  private readonly excerpt: WaveformExcerpt;

  constructor(cycles: number, fundamentalHz: number, sampleIntervalS: number, rowCount: number, channels: { name: string; unit: string }[]) {
    const spanS = cycles / fundamentalHz;
    this.count = Math.min(rowCount, Math.ceil(spanS / sampleIntervalS));
    this.step = Math.max(1, Math.ceil(this.count / WAVEFORM_MAX_POINTS));
    const timeS: number[] = [];
    for (let i = 0; i < this.count; i += this.step) timeS.push(i * sampleIntervalS);
    this.excerpt = { timeS, channels: channels.map((c) => ({ name: c.name, unit: c.unit, values: [] })) };
  }

  /** Takes the kept points among rows firstRow … firstRow + count − 1 (`values[channel][row − firstRow]`). */
  add(values: ArrayLike<number>[], count: number, firstRow: number): void {
    if (firstRow >= this.count) return;
    const end = Math.min(this.count, firstRow + count);
    let i = Math.ceil(firstRow / this.step) * this.step;
    for (; i < end; i += this.step) {
      for (let c = 0; c < this.excerpt.channels.length; c++) this.excerpt.channels[c]!.values.push(values[c]![i - firstRow] ?? 0);
    }
  }

  result(): WaveformExcerpt {
    return this.excerpt;
  }
}
