// The command line's flags → the same mapping and context the upload form produces, so the CLI
// runs the worker's pipeline on them (lib/pipeline/run-capture-analysis.ts, run-capture-evaluation.ts).
import { parseSensorRating } from "@/lib/analysis/parse-sensor-rating";
import { parseArgs } from "node:util";
import { EvaluationContextSchema, type EvaluationContext } from "@/lib/compliance/model";
import { captureMappingSchema, type CaptureMapping } from "@/lib/validations/capture";
import { voltageContextFromSystem } from "./voltage-context-from-system";

/** A command-line mistake: reported on one line, exit code 1. */
export class UsageError extends Error {}

/** Every flag, its value and unit, and what it does: the one list `--help`, README and DEVELOPERS.md show. */
export const ANALYZE_FLAGS = [
  { flag: "--json", value: "", text: "one JSON document per file, one per line (default: readable tables)" },
  { flag: "--frequency", value: "50|60", text: "nominal frequency, Hz (default: detected)" },
  { flag: "--interval", value: "SECONDS", text: "sample interval, s (overrides the time column and preamble)" },
  { flag: "--channel", value: "NAME=current|voltage|ignore", text: "what a column measures (repeatable)" },
  { flag: "--scale", value: "NAME=FACTOR", text: "multiplier applied to a column's values, > 0 (e.g. A per V of a clamp's output; repeatable)" },
  { flag: "--sensor", value: "NAME=RATING", text: "a column's sensor as on its label, e.g. 10mV/A (clamp: ×100), 100:5 (CT), 10mOhm (shunt); sets that column's scale (repeatable)" },
  { flag: "--thd-order", value: "40|50", text: "highest order in THD (default 50, as in the app)" },
  { flag: "--limits", value: "KEY", text: "judge against this limit set (current revision from PostgreSQL when DATABASE_URL is set, else the seed files)" },
  { flag: "--isc", value: "A", text: "maximum short-circuit current at the PCC, A (IEEE 519)" },
  { flag: "--il", value: "A", text: "maximum demand load current, A (IEEE 519; also gives TDD)" },
  { flag: "--iref", value: "A", text: "reference current, A (IEC 61000-3-12; also gives THC/Iref)" },
  { flag: "--rsce", value: "N", text: "short-circuit ratio (IEC 61000-3-12)" },
  { flag: "--rated-power", value: "W", text: "rated power, W (IEC 61000-3-2 Class C/D)" },
  { flag: "--nominal-voltage", value: "V", text: "the system's nominal voltage, V: chooses the IEEE 519 table when --bus-voltage is not given; above 250 V taken as line-to-line (channels' nominal = V/√3)" },
  { flag: "--bus-voltage", value: "V", text: "line-to-line voltage at the PCC, V (chooses the IEEE 519 table)" },
  { flag: "--phase-config", value: "single-phase|balanced-three-phase|other", text: "phase configuration of the equipment (IEC 61000-3-12)" },
  { flag: "--start", value: "ISO-8601", text: "when the record started, e.g. 2024-03-04T12:00:00Z (10-minute values then align to the clock)" },
  { flag: "--diagnose", value: "", text: "adds the likely converter front end behind each current's spectrum (a resemblance, not a fact)" },
  { flag: "--mitigate", value: "SPEC", text: "predicts the spectrum and verdict after a fix (repeatable, applied in order): reactor=3%, dc-choke=4%, pulses=12|18, filter=4.7@300kvar[,q=30] (needs --isc and a voltage), active=100A" },
  { flag: "--help", value: "", text: "this list" },
] as const;

/** The help text: usage line and one line per flag with its unit. */
export function analyzeUsage(): string {
  const width = 24;
  const line = (label: string, text: string): string => (label.length > width ? `  ${label}\n  ${"".padEnd(width)}  ${text}` : `  ${label.padEnd(width)}  ${text}`);
  return [
    "usage: npm run analyze -- FILE [FILE…] [flags]",
    "",
    ...ANALYZE_FLAGS.map((f) => line(`${f.flag} ${f.value}`.trimEnd(), f.text)),
    "",
    "Hard input errors exit 1 with one line on stderr per file.",
  ].join("\n");
}

/** What one call of the command line asks for. */
export interface AnalyzeRequest {
  files: string[];
  json: boolean;
  mapping: CaptureMapping;
  context: EvaluationContext;
  /** Limit-set key, or null to analyse only. */
  limitSetKey: string | null;
  recordStartMs?: number;
  /** --diagnose: add the likely front end of each current channel. */
  diagnose: boolean;
  /** --mitigate SPEC…: what-ifs applied in order. */
  mitigate: string[];
}

const stringFlags = ["frequency", "interval", "thd-order", "limits", "isc", "il", "iref", "rsce", "rated-power", "nominal-voltage", "bus-voltage", "phase-config", "start"] as const;
const contextOnlyFlags = ["isc", "rsce", "rated-power", "nominal-voltage", "bus-voltage", "phase-config", "start"] as const;

function positiveNumber(flag: string, text: string): number {
  const value = Number(text);
  if (!(text.trim() !== "" && Number.isFinite(value) && value > 0)) throw new UsageError(`--${flag} needs a positive number, got "${text}"`);
  return value;
}

function nameValue(flag: string, text: string): [string, string] {
  const at = text.lastIndexOf("=");
  if (at <= 0 || at === text.length - 1) throw new UsageError(`--${flag} needs NAME=VALUE, got "${text}"`);
  return [text.slice(0, at), text.slice(at + 1)];
}

/**
 * Parses the command line into files, the mapping and the evaluation context.
 *
 * @throws UsageError for unknown flags, no file, malformed values (a scale that is not > 0, a
 *   frequency other than 50/60 …) or limit flags without --limits; `--help` throws the help text.
 * @example
 * parseAnalyzeArgs(["cap.csv", "--scale", "Ia=40"]).mapping // { channels: { Ia: { scale: 40 } } }
 */
export function parseAnalyzeArgs(argv: string[]): AnalyzeRequest {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      options: {
        json: { type: "boolean", default: false },
        help: { type: "boolean", default: false },
        channel: { type: "string", multiple: true },
        scale: { type: "string", multiple: true },
        sensor: { type: "string", multiple: true },
        diagnose: { type: "boolean", default: false },
        mitigate: { type: "string", multiple: true },
        ...Object.fromEntries(stringFlags.map((f) => [f, { type: "string" as const }])),
      },
      allowPositionals: true,
      strict: true,
    });
  } catch (error) {
    throw new UsageError(error instanceof Error ? error.message.split("\n")[0]! : String(error));
  }
  const values = parsed.values as Record<string, string | string[] | boolean | undefined>;
  if (values.help) throw new UsageError(analyzeUsage());
  const files = parsed.positionals;
  if (files.length === 0) throw new UsageError("no input file given (npm run analyze -- FILE [FILE…] [flags]; --help lists the flags)");
  const str = (key: string): string | undefined => values[key] as string | undefined;
  const num = (key: string): number | undefined => (str(key) === undefined ? undefined : positiveNumber(key, str(key)!));

  const mapping: CaptureMapping = { channels: {} };
  const frequency = str("frequency");
  if (frequency !== undefined) {
    if (frequency !== "50" && frequency !== "60") throw new UsageError(`--frequency must be 50 or 60, got "${frequency}"`);
    mapping.frequencyHz = Number(frequency) as 50 | 60;
  }
  if (str("interval") !== undefined) mapping.sampleIntervalS = num("interval");
  const thdOrder = str("thd-order");
  if (thdOrder !== undefined) {
    if (thdOrder !== "40" && thdOrder !== "50") throw new UsageError(`--thd-order must be 40 or 50, got "${thdOrder}"`);
    mapping.thdMaxOrder = Number(thdOrder) as 40 | 50;
  }
  for (const item of (values.channel as string[] | undefined) ?? []) {
    const [name, quantity] = nameValue("channel", item);
    if (quantity === "ignore") mapping.channels[name] = { ...mapping.channels[name], ignore: true };
    else if (quantity === "current" || quantity === "voltage") mapping.channels[name] = { ...mapping.channels[name], quantity };
    else throw new UsageError(`--channel ${name}= must be current, voltage or ignore, got "${quantity}"`);
  }
  for (const item of (values.scale as string[] | undefined) ?? []) {
    const [name, factor] = nameValue("scale", item);
    const scale = Number(factor);
    if (!(factor.trim() !== "" && Number.isFinite(scale) && scale > 0)) throw new UsageError(`--scale ${name}= must be a number greater than zero, got "${factor}"`);
    mapping.channels[name] = { ...mapping.channels[name], scale };
  }
  for (const item of (values.sensor as string[] | undefined) ?? []) {
    const [name, ratingText] = nameValue("sensor", item);
    if (mapping.channels[name]?.scale !== undefined) throw new UsageError(`--sensor ${name}= and --scale ${name}= both set its scale; give one`);
    const rating = parseSensorRating(ratingText, mapping.channels[name]?.quantity);
    if (!rating.ok) throw new UsageError(`--sensor ${name}=${ratingText}: ${rating.message}`);
    mapping.channels[name] = { ...mapping.channels[name], scale: rating.scale };
  }
  const checkedMapping = captureMappingSchema.safeParse(mapping);
  if (!checkedMapping.success) throw new UsageError(checkedMapping.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; "));

  const limitSetKey = str("limits") ?? null;
  const mitigate = (values.mitigate as string[] | undefined) ?? [];
  if (limitSetKey === null) {
    // A what-if's filter needs the network at the PCC even when nothing is judged.
    const networkFlags: readonly string[] = mitigate.length > 0 ? ["isc", "bus-voltage", "nominal-voltage"] : [];
    const stray = contextOnlyFlags.find((k) => str(k) !== undefined && !networkFlags.includes(k));
    if (stray) throw new UsageError(`--${stray} only makes sense with --limits KEY`);
  }
  const phase = str("phase-config");
  if (phase !== undefined && !["single-phase", "balanced-three-phase", "other"].includes(phase)) {
    throw new UsageError(`--phase-config must be single-phase, balanced-three-phase or other, got "${phase}"`);
  }
  const busVoltageV = num("bus-voltage");
  const systemV = num("nominal-voltage");
  const voltages = systemV !== undefined ? voltageContextFromSystem(systemV, { busVoltageV }) : busVoltageV !== undefined ? { busVoltageV, busVoltageSource: "given" as const } : {};
  const context = EvaluationContextSchema.parse({
    iscA: num("isc"),
    ilA: num("il"),
    irefA: num("iref"),
    rsce: num("rsce"),
    ratedPowerW: num("rated-power"),
    ...voltages,
    phaseConfig: phase,
  });
  let recordStartMs: number | undefined;
  const start = str("start");
  if (start !== undefined) {
    recordStartMs = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:\d{2})$/.test(start) ? Date.parse(start) : NaN;
    if (!Number.isFinite(recordStartMs)) throw new UsageError(`--start needs a date and time with its offset, e.g. 2024-03-04T12:00:00Z, got "${start}"`);
  }
  return {
    files,
    json: Boolean(values.json),
    mapping: checkedMapping.data,
    context,
    limitSetKey,
    ...(recordStartMs !== undefined ? { recordStartMs } : {}),
    diagnose: Boolean(values.diagnose),
    mitigate,
  };
}
