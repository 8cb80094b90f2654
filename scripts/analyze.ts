// CLI: analyse a capture CSV and print a per-channel harmonic table, or the result JSON.
//   npm run analyze -- FILE [--json] [--frequency 50|60] [--interval SECONDS] [--channel NAME=current|voltage]
//                           [--scale NAME=FACTOR] [--max-order N] [--il A] [--iref A] [--thd-order 40|50]
// Further flags (e.g. --limits KEY) can be added by extending ANALYZE_ARG_OPTIONS and reading
// `values` in the caller; buildAnalysis stays the one place that produces the result.
import { pathToFileURL } from "node:url";
import { parseArgs, type ParseArgsConfig } from "node:util";
import { analyzeCsvFile } from "../lib/analysis/analyze-csv";
import { isAnalysisInputError } from "../lib/analysis/errors";
import { evaluateCompliance, type EvaluateComplianceInput } from "../lib/compliance/evaluate-compliance";
import { formatComplianceTable } from "../lib/compliance/format-compliance-table";
import { EvaluationContextSchema, LimitSetRevisionContentSchema, type EvaluationContext } from "../lib/compliance/model";
import { getSeedLimitSet, seedLimitSets } from "../lib/compliance/seed";
import type { AnalysisOptions, AnalysisResult, ChannelOverride, ChannelResult } from "../lib/analysis/types";
import type { CliAdditions } from "../lib/mitigation/build-cli-additions";
import { MitigationInputError } from "../lib/mitigation/mitigation-input-error";

/** Flags understood by the analysis CLI (exported so other commands can extend them). */
export const ANALYZE_ARG_OPTIONS = {
  json: { type: "boolean", default: false },
  frequency: { type: "string" },
  interval: { type: "string" },
  channel: { type: "string", multiple: true },
  scale: { type: "string", multiple: true },
  "max-order": { type: "string" },
  il: { type: "string" },
  iref: { type: "string" },
  "thd-order": { type: "string" },
  limits: { type: "string" },
  isc: { type: "string" },
  rsce: { type: "string" },
  "rated-power": { type: "string" },
  "nominal-voltage": { type: "string" },
  "bus-voltage": { type: "string" },
  "phase-config": { type: "string" },
  diagnose: { type: "boolean", default: false },
  mitigate: { type: "string", multiple: true },
  help: { type: "boolean", default: false },
} satisfies ParseArgsConfig["options"];

/** A command-line mistake: reported on one line, exit code 1. */
export class UsageError extends Error {}

export interface AnalyzeArgs {
  file: string;
  json: boolean;
  options: AnalysisOptions;
  /** Every parsed flag, for commands that add their own. */
  values: Record<string, unknown>;
}

export const USAGE =
  "usage: npm run analyze -- FILE [--json] [--frequency 50|60] [--interval SECONDS] [--channel NAME=current|voltage] [--scale NAME=FACTOR] [--max-order N] [--il A] [--iref A] [--thd-order 40|50] [--limits KEY [--isc A] [--rsce N] [--rated-power W] [--nominal-voltage V] [--bus-voltage V] [--phase-config single-phase|balanced-three-phase|other]] [--diagnose] [--mitigate reactor=3%|dc-choke=4%|pulses=12|filter=4.7@300kvar[,q=30]|active=100A]…";

function positiveNumber(flag: string, text: string): number {
  const value = Number(text);
  if (!(Number.isFinite(value) && value > 0)) throw new UsageError(`--${flag} needs a positive number, got "${text}"`);
  return value;
}

function nameValue(flag: string, text: string): [string, string] {
  const at = text.lastIndexOf("=");
  if (at <= 0 || at === text.length - 1) throw new UsageError(`--${flag} needs NAME=VALUE, got "${text}"`);
  return [text.slice(0, at), text.slice(at + 1)];
}

/**
 * Parses CLI arguments into a file path and analysis options.
 *
 * @throws UsageError for unknown flags, missing file or malformed values.
 * @example
 * parseAnalyzeArgs(["cap.csv", "--json", "--scale", "Ia=40"]).options // { channels: { Ia: { scale: 40 } } }
 */
export function parseAnalyzeArgs(argv: string[], extra: ParseArgsConfig["options"] = {}): AnalyzeArgs {
  let parsed;
  try {
    parsed = parseArgs({ args: argv, options: { ...ANALYZE_ARG_OPTIONS, ...extra }, allowPositionals: true, strict: true });
  } catch (error) {
    throw new UsageError(error instanceof Error ? error.message.split("\n")[0]! : String(error));
  }
  const values = parsed.values as Record<string, unknown>;
  if (values.help) throw new UsageError(USAGE);
  const [file, ...rest] = parsed.positionals;
  if (!file) throw new UsageError(`no input file given; ${USAGE}`);
  if (rest.length > 0) throw new UsageError(`unexpected argument "${rest[0]}"`);
  const options: AnalysisOptions = {};
  const str = (key: string): string | undefined => values[key] as string | undefined;
  if (str("frequency") !== undefined) {
    if (str("frequency") !== "50" && str("frequency") !== "60") throw new UsageError(`--frequency must be 50 or 60, got "${str("frequency")}"`);
    options.frequencyHz = Number(str("frequency")) as 50 | 60;
  }
  if (str("interval") !== undefined) options.sampleIntervalS = positiveNumber("interval", str("interval")!);
  if (str("max-order") !== undefined) {
    const n = Number(str("max-order"));
    if (!Number.isInteger(n) || n < 1 || n > 100) throw new UsageError(`--max-order must be an integer from 1 to 100, got "${str("max-order")}"`);
    options.maxOrder = n;
  }
  if (str("il") !== undefined) options.ilA = positiveNumber("il", str("il")!);
  if (str("iref") !== undefined) options.irefA = positiveNumber("iref", str("iref")!);
  if (str("thd-order") !== undefined) {
    if (str("thd-order") !== "40" && str("thd-order") !== "50") throw new UsageError(`--thd-order must be 40 or 50, got "${str("thd-order")}"`);
    options.thdMaxOrder = Number(str("thd-order")) as 40 | 50;
  }
  const channels: Record<string, ChannelOverride> = {};
  for (const item of (values.channel as string[] | undefined) ?? []) {
    const [name, quantity] = nameValue("channel", item);
    if (quantity !== "current" && quantity !== "voltage") throw new UsageError(`--channel ${name}= must be current or voltage, got "${quantity}"`);
    channels[name] = { ...channels[name], quantity };
  }
  for (const item of (values.scale as string[] | undefined) ?? []) {
    const [name, factor] = nameValue("scale", item);
    const scale = Number(factor);
    if (!Number.isFinite(scale) || scale === 0) throw new UsageError(`--scale ${name}= needs a non-zero number, got "${factor}"`);
    channels[name] = { ...channels[name], scale };
  }
  if (Object.keys(channels).length > 0) options.channels = channels;
  if (str("limits") === undefined) {
    // A passive filter what-if takes --isc and --bus-voltage without limits.
    const mitigating = ((values.mitigate as string[] | undefined) ?? []).length > 0;
    const stray = [...(mitigating ? [] : ["isc", "bus-voltage"]), "rsce", "rated-power", "nominal-voltage", "phase-config"].find((k) => str(k) !== undefined);
    if (stray) throw new UsageError(`--${stray} only makes sense with --limits KEY`);
  }
  return { file, json: Boolean(values.json), options, values };
}

/**
 * Builds the analysis result for a file: the function other commands (and a later `--limits`)
 * call before adding their own sections.
 *
 * @example
 * const result = await buildAnalysis("fixtures/three-phase-50hz.csv", { thdMaxOrder: 50 });
 */
export async function buildAnalysis(file: string, options: AnalysisOptions): Promise<AnalysisResult> {
  return analyzeCsvFile(file, options);
}

const fmt = (value: number | null | undefined, digits = 4): string =>
  value === null || value === undefined ? "—" : Math.abs(value) >= 1e5 || (Math.abs(value) < 1e-3 && value !== 0) ? value.toExponential(digits - 1) : value.toFixed(digits);

function channelTable(c: ChannelResult): string {
  const lines = [
    `${c.name}  (${c.quantity}, ${c.unit}${c.phase ? `, phase ${c.phase}` : ""})`,
    `  rms ${fmt(c.rms)} ${c.unit}   fundamental ${fmt(c.fundamentalRms)} ${c.unit}   DC ${fmt(c.dc)} ${c.unit}`,
    `  THD(h≤${c.thdMaxOrder}) ${fmt(c.thdPercent, 2)} %   THD40 ${fmt(c.thd40Percent, 2)} %   THD50 ${fmt(c.thd50Percent, 2)} %   PWHD ${fmt(c.pwhdPercent, 2)} %`,
    `  crest factor ${fmt(c.crestFactor, 3)}   K-factor ${fmt(c.kFactor, 2)}   factor K ${fmt(c.factorK, 3)} (e=${c.factorKParameters?.eddyLossRatio}, q=${c.factorKParameters?.exponent})`,
  ];
  if (c.quantity === "current") {
    lines.push(
      `  THC ${fmt(c.thcA)} A   PWHC ${fmt(c.pwhcA)} A` +
        (c.tddPercent !== undefined ? `   TDD ${fmt(c.tddPercent, 2)} %` : "") +
        (c.thcPercentOfIref !== undefined ? `   THC/Iref ${fmt(c.thcPercentOfIref, 2)} %   PWHC/Iref ${fmt(c.pwhcPercentOfIref, 2)} %` : ""),
    );
  }
  lines.push(`  order        rms ${c.unit.padEnd(2)}   % of h1   phase °`);
  for (const h of c.harmonics) {
    lines.push(`  ${String(h.order).padStart(5)}  ${fmt(h.rms).padStart(12)}  ${fmt(h.percentOfFundamental, 2).padStart(8)}  ${fmt(h.phaseDeg, 1).padStart(8)}`);
  }
  return lines.join("\n");
}

/**
 * Renders a result as a readable report: header, one table per channel, power and sequence.
 *
 * @example
 * console.log(formatAnalysis(result));
 */
export function formatAnalysis(r: AnalysisResult): string {
  const parts = [
    `fundamental ${r.fundamentalHz.toFixed(4)} Hz (nominal ${r.nominalHz} Hz)   sample interval ${r.sampleIntervalS.toPrecision(6)} s   duration ${r.durationS.toFixed(3)} s`,
    `windows: ${r.window.count} × ${r.window.cycles} cycles resampled to ${r.window.points} points   orders evaluated up to ${r.maxResolvableOrder}`,
    ...r.channels.map(channelTable),
  ];
  if (r.power.phases.length > 0) {
    parts.push(
      [
        "power (displacement factor: + current lags, − current leads)",
        ...r.power.phases.map(
          (p) =>
            `  ${p.voltage} × ${p.current}: P ${fmt(p.activePowerW, 2)} W   S ${fmt(p.apparentPowerVA, 2)} VA   displacement ${fmt(p.displacementFactor)}   distortion ${fmt(p.distortionFactor)}   true PF ${fmt(p.truePowerFactor)}`,
        ),
        ...(r.power.total
          ? [`  total: P ${fmt(r.power.total.activePowerW, 2)} W   S ${fmt(r.power.total.apparentPowerVA, 2)} VA   true PF ${fmt(r.power.total.truePowerFactor)}`]
          : []),
      ].join("\n"),
    );
  }
  for (const s of r.sequence ?? []) {
    const h1 = s.orders[0];
    parts.push(
      `sequence (${s.quantity}: ${s.channels.join(", ")}): fundamental positive ${fmt(h1?.positiveRms)} ${s.unit}, negative ${fmt(h1?.negativeRms)} ${s.unit}, zero ${fmt(h1?.zeroRms)} ${s.unit}, unbalance ${fmt(s.unbalancePercent, 2)} %`,
    );
  }
  if (r.warnings.length > 0) parts.push(["warnings:", ...r.warnings.map((w) => `  - ${w}`)].join("\n"));
  return parts.join("\n\n");
}

/** The evaluation context from the limit flags. */
function limitContext(args: AnalyzeArgs): EvaluationContext {
  const str = (key: string) => args.values[key] as string | undefined;
  const num = (key: string) => (str(key) === undefined ? undefined : positiveNumber(key, str(key)!));
  const phase = str("phase-config");
  if (phase !== undefined && !["single-phase", "balanced-three-phase", "other"].includes(phase)) {
    throw new UsageError(`--phase-config must be single-phase, balanced-three-phase or other, got "${phase}"`);
  }
  return EvaluationContextSchema.parse({
    iscA: num("isc"),
    ilA: args.options.ilA,
    irefA: args.options.irefA,
    rsce: num("rsce"),
    ratedPowerW: num("rated-power"),
    nominalVoltageV: num("nominal-voltage"),
    busVoltageV: num("bus-voltage"),
    phaseConfig: phase,
  });
}

/**
 * The current revision of a limit set: from PostgreSQL when DATABASE_URL is set (the tables
 * admins maintain), otherwise from the seed files the database is seeded from.
 */
async function loadLimitSet(key: string): Promise<EvaluateComplianceInput["limitSet"]> {
  const url = process.env.DATABASE_URL;
  if (url) {
    const { default: postgres } = await import("postgres");
    const sql = postgres(url, { max: 1, onnotice: () => undefined });
    try {
      const [row] = await sql<{ name: string; id: string; number: number; content: unknown }[]>`
        select s.name, r.id, r.number, r.content from limit_sets s join limit_set_revisions r on r.id = s.current_revision_id where s.key = ${key}`;
      if (row) return { key, name: row.name, revision: { id: row.id, number: row.number }, content: LimitSetRevisionContentSchema.parse(row.content) };
    } finally {
      await sql.end();
    }
  }
  const seed = getSeedLimitSet(key);
  if (!seed) throw new UsageError(`unknown limit set "${key}"; known keys: ${seedLimitSets.map((s) => s.key).join(", ")}`);
  return { key, name: seed.name, revision: { id: `seed:${key}`, number: 1 }, content: seed.content };
}

/** Runs the CLI; returns the exit code. */
export async function main(argv: string[]): Promise<number> {
  try {
    const args = parseAnalyzeArgs(argv);
    const limits = args.values.limits as string | undefined;
    const context = limits ? limitContext(args) : null;
    const result = await buildAnalysis(args.file, args.options);
    if (!limits || !context) {
      const extra = await mitigationAdditions(args, result, undefined);
      process.stdout.write(args.json ? `${JSON.stringify({ ...result, ...extra.json })}\n` : `${formatAnalysis(result)}\n${extra.text}`);
      return 0;
    }
    const limitSet = await loadLimitSet(limits);
    const compliance = evaluateCompliance({ analysis: result, limitSet, context });
    const extra = await mitigationAdditions(args, result, { limitSet, context });
    process.stdout.write(
      args.json ? `${JSON.stringify({ ...result, compliance, ...extra.json })}\n` : `${formatAnalysis(result)}\n\n${formatComplianceTable(compliance)}\n${extra.text}`,
    );
    return 0;
  } catch (error) {
    if (error instanceof UsageError || isAnalysisInputError(error) || error instanceof MitigationInputError) {
      process.stderr.write(`error: ${error.message.replace(/\s*\n\s*/g, " ")}\n`);
      return 1;
    }
    const message = error instanceof Error ? error.message : String(error);
    process.stderr.write(`internal error: ${message.replace(/\s*\n\s*/g, " ")}\n`);
    return 2;
  }
}

// --- --diagnose / --mitigate (lib/frontends, lib/mitigation) -----------------------------------
/** The diagnosis and what-if for the flags given: JSON parts and a few lines of text. */
async function mitigationAdditions(
  args: AnalyzeArgs,
  analysis: AnalysisResult,
  compliance: { limitSet: EvaluateComplianceInput["limitSet"]; context: EvaluationContext } | undefined,
): Promise<{ json: CliAdditions; text: string }> {
  const mitigate = (args.values.mitigate as string[] | undefined) ?? [];
  if (!args.values.diagnose && mitigate.length === 0) return { json: {}, text: "" };
  // Loaded only when asked for: the models and their precomputed grids are not needed otherwise.
  const { buildCliAdditions } = await import("../lib/mitigation/build-cli-additions");
  const num = (key: string) => (args.values[key] === undefined ? undefined : positiveNumber(key, args.values[key] as string));
  const json = buildCliAdditions(analysis, { diagnose: Boolean(args.values.diagnose), mitigate, compliance, network: { iscA: num("isc"), busVoltageV: num("bus-voltage") } });
  const lines: string[] = [];
  for (const c of json.diagnosis?.channels ?? []) {
    lines.push(`${c.name}: likely source (a resemblance, not a fact)`);
    for (const k of c.candidates) lines.push(`  ${k.family.padEnd(24)} fit error ${k.fitErrorPercent.toFixed(1).padStart(5)} %  ${k.description}`);
  }
  if (json.whatIf) {
    lines.push(`PREDICTION after ${mitigate.join(" + ")}:`);
    for (const c of json.whatIf.channels) lines.push(`  ${c.name}: THD ${c.thdPercent.toFixed(1)} %${c.tddPercent === null ? "" : `, TDD ${c.tddPercent.toFixed(1)} %`}`);
    if (json.whatIf.compliance) lines.push(`  predicted verdict: ${json.whatIf.compliance.verdict}`);
    for (const w of json.whatIf.warnings) lines.push(`  warning: ${w}`);
    lines.push(`  ${json.whatIf.caution}`);
  }
  return { json, text: lines.length > 0 ? `\n${lines.join("\n")}\n` : "" };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main(process.argv.slice(2)).then((code) => {
    process.exitCode = code;
  });
}
