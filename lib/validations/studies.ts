import { z } from "zod";
import { singleLineText } from "./text";
import { MitigationStudyInputsSchema } from "@/lib/mitigation/study-inputs";

/**
 * Which evaluation a study starts from (its analysis, limit-set revision and context); absent: the one
 * the sheet shows by default — the approved evaluation while there is one, else the newest.
 */
const startingEvaluation = z.uuid("Not an evaluation id").optional();

/** Try a fix: compute a what-if without saving it. */
export const previewStudySchema = MitigationStudyInputsSchema.extend({ evaluationId: startingEvaluation });

/** Save a study to the capture. */
export const saveStudySchema = z.object({
  title: singleLineText().trim().min(1, "Give the study a title").max(120, "At most 120 characters"),
  includeInReport: z.boolean().default(false),
  inputs: MitigationStudyInputsSchema,
  evaluationId: startingEvaluation,
});

export type SaveStudy = z.infer<typeof saveStudySchema>;
