// Shapes shared by the analysis engine, the compliance evaluator, the CLI and the API.
// Field names follow the analysis JSON of the product design; units are in the names.

export type Quantity = "current" | "voltage";

/** One harmonic order of one channel, aggregated over all windows (rms mean of windows). */
export interface HarmonicValue {
  order: number;
  /** r.m.s. value in the channel's unit (A or V); null when the order is above Nyquist. */
  rms: number | null;
  phaseDeg: number | null;
  percentOfFundamental: number | null;
  /** Largest window value and 95th percentile over windows (same unit as rms). */
  max?: number | null;
  p95?: number | null;
}

export interface ChannelResult {
  /** The channel's header text in the source file. */
  name: string;
  quantity: Quantity;
  /** "A" or "V". */
  unit: string;
  /** Phase label when recognised from the name: "a" | "b" | "c" (null for single channels). */
  phase: string | null;
  rms: number;
  dc: number;
  fundamentalRms: number;
  thdPercent: number;
  /** Upper order used for THD (40 or 50, capped at Nyquist). */
  thdMaxOrder: number;
  crestFactor: number;
  kFactor: number;
  harmonics: HarmonicValue[];
  /** Optional indices; present when computable. */
  pwhdPercent?: number;
  tddPercent?: number;
  thcA?: number;
  pwhcA?: number;
  /** Per-window series for charts: one entry per window. */
  series?: { rms: number[]; thdPercent: number[]; fundamentalRms: number[] };
}

export interface PowerPhase {
  voltage: string;
  current: string;
  activePowerW: number;
  apparentPowerVA: number;
  displacementFactor: number;
  distortionFactor: number;
  truePowerFactor: number;
}

export interface AnalysisResult {
  fundamentalHz: number;
  nominalHz: 50 | 60;
  sampleIntervalS: number;
  durationS: number;
  window: { cycles: number; points: number; count: number };
  /** Highest harmonic order below Nyquist. */
  maxResolvableOrder: number;
  channels: ChannelResult[];
  power: {
    phases: PowerPhase[];
    total: { activePowerW: number; apparentPowerVA: number; truePowerFactor: number } | null;
  };
  warnings: string[];
}
