// Starts the command line's analysis helper thread (lib/analysis/analysis-helper.ts) when a core is
// free for it. Bundled as its own small module (dist/cli/start-analysis-helper.mjs) so that
// scripts/analyze.mjs can start the thread before it loads the command line: the thread's start-up
// and warming up then overlap the main thread's.
import { AnalysisHelper } from "@/lib/analysis/analysis-helper";

/**
 * Whether the command line starts its helper thread: when AnalysisHelper.wouldHelp() (a free
 * core), or as ORDWISE_ANALYSIS_HELPER=on|off says (tests and benchmarks take either path on purpose).
 */
export function analysisHelperWanted(): boolean {
  const setting = process.env.ORDWISE_ANALYSIS_HELPER;
  return setting === "on" || (setting !== "off" && AnalysisHelper.wouldHelp());
}

/**
 * The helper thread when {@link analysisHelperWanted}, else null.
 *
 * @example
 * const helper = startAnalysisHelper(); try { … } finally { await helper?.close(); }
 */
export function startAnalysisHelper(): AnalysisHelper | null {
  // Built beside this module by scripts/build-cli.mjs; without it the analysis runs in one thread, with the same result.
  return analysisHelperWanted() ? AnalysisHelper.start(new URL("./analysis-helper-thread.mjs", import.meta.url)) : null;
}
