import type { AnalysisResult } from "../analysis/types";
import type { EvaluateComplianceInput } from "../compliance/evaluate-compliance";
import type { EvaluationContext } from "../compliance/model";
import type { ComplianceResult } from "../compliance/result";
import { diagnoseChannels } from "../frontends/diagnose-channels";
import type { FrontEndFamily, FrontEndParameters } from "../frontends/types";
import { buildWhatIfReport } from "./build-what-if-report";
import { parseMitigationSpec } from "./parse-mitigation-spec";
import type { Mitigation, NetworkData } from "./types";

/** The `diagnosis` and `whatIf` parts of `npm run analyze -- FILE --json [--diagnose] [--mitigate SPEC]…`. */
export interface CliAdditions {
  diagnosis?: { channels: { name: string; candidates: { family: FrontEndFamily; parameters: FrontEndParameters; fitErrorPercent: number; description: string }[] }[] };
  whatIf?: {
    prediction: true;
    mitigations: Mitigation[];
    channels: { name: string; harmonics: { order: number; rms: number | null }[]; thdPercent: number; tddPercent: number | null }[];
    /** Same shape as the measured `compliance`; present when limits were given. */
    compliance?: ComplianceResult;
    warnings: string[];
    assumptions: string[];
    caution: string;
  };
}

/**
 * What the analysis CLI adds for `--diagnose` and `--mitigate SPEC` (repeatable, applied in order):
 * the diagnosis's candidates best first, and the what-if with the predicted per-order values,
 * THD/TDD and the predicted compliance re-judged like the measured one (same set and context).
 * Throws a one-line message naming a bad spec or a missing input (e.g. a filter without --isc).
 *
 * @example buildCliAdditions(analysis, { diagnose: true, mitigate: ["reactor=3%"] }).whatIf?.channels[0]?.thdPercent
 */
export function buildCliAdditions(
  analysis: AnalysisResult,
  options: { diagnose?: boolean; mitigate?: readonly string[]; compliance?: { limitSet: EvaluateComplianceInput["limitSet"]; context: EvaluationContext }; network?: NetworkData },
): CliAdditions {
  const specs = options.mitigate ?? [];
  const mitigations = specs.map(parseMitigationSpec);
  if (!options.diagnose && mitigations.length === 0) return {};
  const diagnosis = diagnoseChannels(analysis);
  const out: CliAdditions = {};
  if (options.diagnose) {
    out.diagnosis = {
      channels: diagnosis.channels.map((c) => ({
        name: c.name,
        candidates: c.candidates.map(({ family, parameters, fitErrorPercent, description }) => ({ family, parameters, fitErrorPercent, description })),
      })),
    };
  }
  if (mitigations.length > 0) {
    const r = buildWhatIfReport({ analysis, mitigations, diagnosis, network: options.network, compliance: options.compliance });
    out.whatIf = {
      prediction: true,
      mitigations: r.mitigations,
      channels: r.channels.map((c) => ({ name: c.name, harmonics: c.harmonics.map(({ order, rms }) => ({ order, rms })), thdPercent: c.thdPercent, tddPercent: c.tddPercent })),
      ...(r.compliance ? { compliance: r.compliance } : {}),
      warnings: r.warnings,
      assumptions: r.assumptions,
      caution: r.caution,
    };
  }
  return out;
}
