import { z } from "zod";
import { singleLineText } from "./text";
import { MitigationStudyInputsSchema } from "@/lib/mitigation/study-inputs";

/** Try a fix: compute a what-if without saving it. */
export const previewStudySchema = MitigationStudyInputsSchema;

/** Save a study to the capture. */
export const saveStudySchema = z.object({
  title: singleLineText().trim().min(1, "Give the study a title").max(120, "At most 120 characters"),
  includeInReport: z.boolean().default(false),
  inputs: MitigationStudyInputsSchema,
});

export type SaveStudy = z.infer<typeof saveStudySchema>;
