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
  /** THD to order 40 and to order 50 (null when that order is above the resolvable order). */
  thd40Percent?: number | null;
  thd50Percent?: number | null;
  /** THC and PWHC in % of Iref, when Iref is given. */
  thcPercentOfIref?: number;
  pwhcPercentOfIref?: number;
  /** BS 7821 factor K with its parameters. */
  factorK?: number;
  factorKParameters?: { eddyLossRatio: number; exponent: number; maxOrder: number };
  /** Largest |sample| over the analysed windows (A or V). */
  peak?: number;
  /** Scale factor applied to the values as read. */
  scale?: number;
  /** IEC 61000-4-7 groups and subgroups per order. */
  groups?: HarmonicGroupValue[];
  /** Per-window rms of each order: harmonicSeries[order - 1][window]; null above the resolvable order. */
  harmonicSeries?: (number[] | null)[];
}

export interface PowerPhase {
  voltage: string;
  current: string;
  activePowerW: number;
  apparentPowerVA: number;
  displacementFactor: number;
  distortionFactor: number;
  truePowerFactor: number;
  /**
   * Angle of the voltage fundamental minus the current fundamental, degrees in (−180, 180]:
   * positive when the current lags (inductive). displacementFactor = |cos| with the sign of this
   * angle (+ lagging, − leading); |angle| > 90° means power flows towards the source.
   */
  displacementAngleDeg?: number;
  phase?: string | null;
}

export interface AnalysisResult {
  /** Mean fundamental over the analysed windows, Hz (their cycles divided by their duration). */
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
  /** Symmetrical components per order for each recognised three-phase set. */
  sequence?: SequenceSet[];
  /** Where the sample interval came from. */
  sampleIntervalSource?: "time-column" | "preamble" | "option";
  /** First cycles of each channel, when `options.keepWaveformCycles` was given to the file path. */
  waveform?: WaveformExcerpt;
  /** An interval log's own values summarised over the logged period (interval logs only; no waveform behind them). */
  intervalLog?: IntervalLogStatistics;
}

/** What a logger stored per interval for a column (the interval mapping's `statistic`). */
export type LoggedStatistic = "avg" | "max" | "min" | "p95" | "p99" | "other";

/** One logged quantity over every logged interval, in its unit. */
export interface IntervalValueStatistics {
  /** √(mean of squares) of the interval values (the IEC 61000-4-30 aggregation of r.m.s. quantities). */
  rmsMean: number;
  /** 95th percentile of the interval values, nearest rank. */
  p95: number;
  max: number;
  /** What each interval value is: the logger's per-interval statistic of the column behind it. */
  logged: LoggedStatistic;
}

/** An interval-log channel's headline values; null where the log has no column for the quantity. */
export interface IntervalChannelStatistics {
  name: string;
  quantity: Quantity;
  unit: "A" | "V";
  /** The logged r.m.s. column. */
  rms: IntervalValueStatistics | null;
  /** The logged order-1 column, else r.m.s. / √(1 + THD²) per interval when both are logged. */
  fundamental: IntervalValueStatistics | null;
  /** The logged THD column, % of the fundamental. */
  thdPercent: IntervalValueStatistics | null;
  /** THD × fundamental per interval, in A or V (TDD is this over IL); null without a THD column and a fundamental. */
  distortion: IntervalValueStatistics | null;
}

/** An interval log summarised: how many values of what length, and each channel's statistics. */
export interface IntervalLogStatistics {
  intervalS: number;
  rowCount: number;
  startMs: number;
  endMs: number;
  channels: IntervalChannelStatistics[];
}

// ---------------------------------------------------------------------------------------------
// Additions by the analysis engine (optional fields and option types; existing names unchanged).

export type PhaseLabel = "a" | "b" | "c";

/** Per-channel settings given by the user; keys of `AnalysisOptions.channels` are header texts or names. */
export interface ChannelOverride {
  quantity?: Quantity;
  /**
   * Multiplies the values as read (after the unit prefix: mV → V) to give A or V at the primary:
   * CT ratio, probe factor, or A per V of a clamp.
   */
  scale?: number;
  phase?: PhaseLabel | null;
  /** Leave this column out entirely (not analysed, no warning). */
  ignore?: boolean;
  /** Read this column as the time axis (instead of the one its header suggests). */
  time?: boolean;
}

export interface AnalysisOptions {
  /** Nominal frequency; chosen from the measured fundamental when absent. */
  frequencyHz?: 50 | 60;
  /** Sample interval in seconds; overrides the time column and the preamble. */
  sampleIntervalS?: number;
  channels?: Record<string, ChannelOverride>;
  /** Highest order reported (default 50, at most 100). */
  maxOrder?: number;
  /** Maximum demand load current IL (A) for TDD (IEEE 519). */
  ilA?: number;
  /** Reference current Iref (A) for THC/PWHC in % (IEC 61000-3-12). */
  irefA?: number;
  /** Upper order of THD (default 40; 50 for IEEE 519 / IEC 61000-4-30). */
  thdMaxOrder?: 40 | 50;
  /** BS 7821 factor K parameters: e = eddy-current loss / I²R loss at fundamental (default 0.1), exponent q (default 1.7). */
  factorKEddyLossRatio?: number;
  factorKExponent?: number;
  /** Keep per-window rms of every order in `ChannelResult.harmonicSeries` (for charts). */
  includeOrderSeries?: boolean;
  /**
   * The fundamental is estimated per segment of this many samples (default 2^18 ≈ 10 s at
   * 25.6 kS/s; the last segment takes the remainder) as the carrier of the phase tracking that
   * cuts every window to whole cycles of its own fundamental. At least 4096.
   */
  frequencySegmentSamples?: number;
  /**
   * Return the first N cycles of every channel (≤ 600 points per channel, evenly decimated) as
   * `AnalysisResult.waveform`, for a waveform chart. Used by the file (streaming) path.
   */
  keepWaveformCycles?: number;
}

/** The first cycles of each channel, for a chart: time from the first sample, values in A or V. */
export interface WaveformExcerpt {
  timeS: number[];
  channels: { name: string; unit: string; values: number[] }[];
}

/** IEC 61000-4-7 grouping of one order, aggregated over windows (r.m.s. mean). */
export interface HarmonicGroupValue {
  order: number;
  groupRms: number | null;
  subgroupRms: number | null;
  /** Interharmonic group / centred subgroup between this order and the next. */
  interharmonicGroupRms: number | null;
  interharmonicSubgroupRms: number | null;
}

/** Symmetrical components of one order of a three-phase set (r.m.s. mean over windows). */
export interface SequenceOrderValue {
  order: number;
  positiveRms: number | null;
  negativeRms: number | null;
  zeroRms: number | null;
}

export interface SequenceSet {
  quantity: Quantity;
  unit: string;
  /** Channel names of phases a, b, c. */
  channels: [string, string, string];
  /** Negative / positive sequence of the fundamental, %. */
  unbalancePercent: number;
  orders: SequenceOrderValue[];
}
