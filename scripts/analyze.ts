// The analysis command line: runs the worker's pipeline (lib/pipeline) on files on disk.
//   npm run analyze -- FILE [FILE…] [flags]      (npm run analyze -- --help lists every flag with its unit)
// With --limits KEY the current revision of the limit set is read from PostgreSQL when DATABASE_URL
// is set (the same query the worker uses), otherwise from the seed files; the output says which.
import { pathToFileURL } from "node:url";
import type { AnalysisHelper } from "@/lib/analysis/analysis-helper";
import { isAnalysisInputError } from "@/lib/analysis/errors";
import { formatComplianceTable } from "@/lib/compliance/format-compliance-table";
import { formatAnalysisText } from "@/lib/pipeline/format-analysis-text";
import { parseAnalyzeArgs, UsageError, type AnalyzeRequest } from "@/lib/pipeline/parse-analyze-args";
import { runCaptureAnalysis } from "@/lib/pipeline/run-capture-analysis";
import { runCaptureEvaluation } from "@/lib/pipeline/run-capture-evaluation";
import type { LimitSetRevision } from "@/lib/pipeline/types";
import { UnknownLimitSetError } from "@/lib/pipeline/unknown-limit-set-error";
import type { AnalysisResult } from "@/lib/analysis/types";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { CliAdditions } from "@/lib/mitigation/build-cli-additions";
import { MitigationInputError } from "@/lib/mitigation/mitigation-input-error";
import { startAnalysisHelper } from "./start-analysis-helper";

type LimitSetSource = "database" | "seed-files";

/** The limit set's current revision and where it came from. */
async function loadLimitSet(key: string): Promise<{ limitSet: LimitSetRevision; source: LimitSetSource }> {
  // Loaded only when needed: the seed tables and the database client take time to load.
  if (!process.env.DATABASE_URL) return { limitSet: (await import("@/lib/pipeline/seed-limit-set-revision")).seedLimitSetRevision(key), source: "seed-files" };
  const [{ getCurrentRevision }, { AppError }, { sql }] = await Promise.all([import("@/db/queries/captures"), import("@/lib/errors"), import("@/db/client")]);
  try {
    return { limitSet: await getCurrentRevision({ key }), source: "database" };
  } catch (error) {
    if (error instanceof AppError && error.code === "not_found") throw new UnknownLimitSetError(`unknown limit set "${key}" in the database at DATABASE_URL`);
    throw error;
  } finally {
    await sql.end({ timeout: 5 });
  }
}

function sourceLine(limitSet: LimitSetRevision, source: LimitSetSource): string {
  return source === "database"
    ? `limit set ${limitSet.key} "${limitSet.name}", revision ${limitSet.revisionNumber} (${limitSet.revisionId}), current revision read from PostgreSQL (DATABASE_URL)`
    : `limit set ${limitSet.key} "${limitSet.name}", from the seed files as shipped (revision 1 of a freshly seeded database; set DATABASE_URL to use the tables your admins maintain)`;
}

/** Analyses (and judges) one file; returns what to print. */
async function runFile(
  file: string,
  request: AnalyzeRequest,
  limits: { limitSet: LimitSetRevision; source: LimitSetSource } | null,
  helper: AnalysisHelper | null,
): Promise<string> {
  const { analysis } = await runCaptureAnalysis(file, request.mapping, request.context, { cycles: 0, helper });
  if (!limits) {
    const extra = await mitigationAdditions(request, analysis, undefined);
    return request.json ? JSON.stringify({ file, ...analysis, ...extra.json }) : `${file}\n\n${formatAnalysisText(analysis)}\n${extra.text}`;
  }
  const compliance = runCaptureEvaluation(analysis, limits.limitSet, request.context, request.recordStartMs);
  const extra = await mitigationAdditions(request, analysis, { limitSet: limits.limitSet, context: request.context });
  return request.json
    ? JSON.stringify({ file, ...analysis, compliance, limitSetSource: limits.source, ...extra.json })
    : `${file}\n\n${formatAnalysisText(analysis)}\n\n${sourceLine(limits.limitSet, limits.source)}\n${formatComplianceTable(compliance)}\n${extra.text}`;
}

// --- --diagnose / --mitigate (lib/frontends, lib/mitigation) -----------------------------------
/** The diagnosis and what-if for the flags given: JSON parts and a few lines of text. */
async function mitigationAdditions(
  request: AnalyzeRequest,
  analysis: AnalysisResult,
  compliance: { limitSet: LimitSetRevision; context: EvaluationContext } | undefined,
): Promise<{ json: CliAdditions; text: string }> {
  const { diagnose, mitigate } = request;
  if (!diagnose && mitigate.length === 0) return { json: {}, text: "" };
  // Loaded only when asked for: the models and their precomputed grids are not needed otherwise.
  const { buildCliAdditions } = await import("@/lib/mitigation/build-cli-additions");
  const json = buildCliAdditions(analysis, {
    diagnose,
    mitigate,
    ...(compliance
      ? {
          compliance: {
            limitSet: { key: compliance.limitSet.key, name: compliance.limitSet.name, revision: { id: compliance.limitSet.revisionId, number: compliance.limitSet.revisionNumber }, content: compliance.limitSet.content },
            context: compliance.context,
          },
        }
      : {}),
    network: { iscA: request.context.iscA, busVoltageV: request.context.busVoltageV },
  });
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

const oneLine = (message: string): string => message.replace(/\s*\n\s*/g, " ");

/**
 * Runs the CLI; returns the exit code (0 all files done, 1 a usage or input problem, 2 an internal error).
 *
 * @param options.helper the analysis helper thread scripts/analyze.mjs started before loading this
 *   module (closed here); when not given, it is started here (startAnalysisHelper).
 */
export async function main(argv: string[], options: { helper?: AnalysisHelper | null } = {}): Promise<number> {
  let request: AnalyzeRequest;
  let limits: { limitSet: LimitSetRevision; source: LimitSetSource } | null = null;
  // A second thread for the analysis when a core is free for it (the same result, sooner).
  const helper = options.helper !== undefined ? options.helper : startAnalysisHelper(argv);
  try {
    request = parseAnalyzeArgs(argv);
    if (request.limitSetKey) limits = await loadLimitSet(request.limitSetKey);
  } catch (error) {
    await helper?.close();
    if (error instanceof UsageError && argv.includes("--help")) {
      process.stdout.write(`${error.message}\n`);
      return 0;
    }
    if (error instanceof UsageError || error instanceof UnknownLimitSetError) {
      process.stderr.write(`error: ${oneLine(error.message)}\n`);
      return 1;
    }
    process.stderr.write(`internal error: ${oneLine(error instanceof Error ? error.message : String(error))}\n`);
    return 2;
  }
  let code = 0;
  try {
    for (const [i, file] of request.files.entries()) {
      try {
        const out = await runFile(file, request, limits, helper);
        process.stdout.write(request.json ? `${out}\n` : `${i > 0 ? "\n" : ""}${out}\n`);
      } catch (error) {
        const input = isAnalysisInputError(error) || error instanceof MitigationInputError;
        const message = oneLine(error instanceof Error ? error.message : String(error));
        process.stderr.write(`${input ? "error" : "internal error"}: ${file}: ${message}\n`);
        if (request.json) process.stdout.write(`${JSON.stringify({ file, error: message })}\n`);
        code = Math.max(code, input ? 1 : 2);
      }
    }
  } finally {
    await helper?.close();
  }
  return code;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main(process.argv.slice(2)).then((code) => {
    process.exitCode = code;
  });
}
