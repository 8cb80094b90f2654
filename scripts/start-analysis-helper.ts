// Starts the command line's analysis helper thread (lib/analysis/analysis-helper.ts) when a core is
// free for it. Bundled as its own small module (dist/cli/start-analysis-helper.mjs) so that
// scripts/analyze.mjs can start the thread before it loads the command line: the thread's start-up
// and warming up then overlap the main thread's.
import { statSync } from "node:fs";
import { AnalysisHelper } from "@/lib/analysis/analysis-helper";

/** Files at least this large may have their lines counted ahead by the helper (see AnalysisHelper.countAhead). */
const COUNT_AHEAD_BYTES = 4 << 20;

/**
 * Whether the command line starts its helper thread: when AnalysisHelper.wouldHelp() (a free
 * core), or as ORDWISE_ANALYSIS_HELPER=on|off says (tests and benchmarks take either path on purpose).
 */
export function analysisHelperWanted(): boolean {
  const setting = process.env.ORDWISE_ANALYSIS_HELPER;
  return setting === "on" || (setting !== "off" && AnalysisHelper.wouldHelp());
}

/**
 * The helper thread when {@link analysisHelperWanted}, else null. Given the command line's
 * arguments, it counts the lines of the first large file among them ahead (while the command line
 * loads); an argument that is no file is passed over.
 *
 * @example
 * const helper = startAnalysisHelper(process.argv.slice(2)); try { … } finally { await helper?.close(); }
 */
export function startAnalysisHelper(args: readonly string[] = []): AnalysisHelper | null {
  // Built beside this module by scripts/build-cli.mjs; without it the analysis runs in one thread, with the same result.
  const helper = analysisHelperWanted() ? AnalysisHelper.start(new URL("./analysis-helper-thread.mjs", import.meta.url)) : null;
  const file = helper ? args.find((arg) => !arg.startsWith("-") && largeFile(arg)) : undefined;
  if (helper && file) helper.countAhead(file);
  return helper;
}

function largeFile(path: string): boolean {
  try {
    const stats = statSync(path);
    return stats.isFile() && stats.size >= COUNT_AHEAD_BYTES;
  } catch {
    return false;
  }
}
