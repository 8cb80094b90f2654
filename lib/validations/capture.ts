import { z } from "zod";
import { EvaluationContextSchema } from "@/lib/compliance/model";
import { IntervalMappingSchema } from "@/lib/intervals/types";
import { boundedIsoDate, boundedIsoDateTime, multiLineText, singleLineText } from "./text";

export const maxUploadBytes = 200 * 1024 * 1024;

const optionalNumber = (schema: z.ZodNumber) =>
  z.preprocess((v) => (v === "" || v === null || v === undefined ? undefined : v), schema.optional());

export const registerCaptureSchema = z.object({
  siteId: z.uuid("Choose a site"),
  kind: z.enum(["waveform", "interval-log"]).default("waveform"),
  title: singleLineText().trim().min(2, "Title needs at least 2 characters").max(160, "Title is too long (max 160)"),
  filename: singleLineText()
    .trim()
    .min(1)
    .max(255)
    .refine((f) => /\.(csv|txt)$/i.test(f), "Upload a .csv (or .txt) export"),
  sizeBytes: z
    .number()
    .int()
    .positive("The file is empty")
    .max(maxUploadBytes, `The file is larger than the ${maxUploadBytes / 1024 / 1024} MB limit`),
  capturedAt: boundedIsoDateTime().optional(),
});

export const channelMappingSchema = z.object({
  quantity: z.enum(["current", "voltage"]).optional(),
  scale: optionalNumber(
    z
      .number("Scale must be a number (A or V per unit recorded)")
      .positive("Scale must be greater than zero: it multiplies the recorded values (zero would erase them, a negative one invert them)"),
  ),
  phase: z.enum(["a", "b", "c"]).nullable().optional(),
  /** Leave a column out of the analysis. */
  ignore: z.boolean().optional(),
  /** Read this column as the time axis. */
  time: z.boolean().optional(),
});

export const captureMappingSchema = z.object({
  channels: z.record(z.string(), channelMappingSchema).default({}),
  sampleIntervalS: optionalNumber(z.number().positive("Sample interval must be greater than zero").max(1, "Sample interval above 1 s cannot resolve harmonics")),
  frequencyHz: z.union([z.literal(50), z.literal(60)]).optional(),
  thdMaxOrder: z.union([z.literal(40), z.literal(50)]).optional(),
});

export const captureSetupSchema = z.object({
  mapping: captureMappingSchema,
  limitSetKey: z.string().min(1, "Choose a limit set"),
  context: EvaluationContextSchema,
});

/** An interval log's mapping as stored on the capture (and remembered on its site). */
export const intervalSetupMappingSchema = z.object({ intervalMapping: IntervalMappingSchema });

export const intervalSetupSchema = z.object({
  intervalMapping: IntervalMappingSchema,
  limitSetKey: z.string().min(1, "Choose a limit set"),
  context: EvaluationContextSchema,
});

/** Switch an upload between waveform record and interval log (before analysis). */
export const switchKindSchema = z.object({ kind: z.enum(["waveform", "interval-log"]) });

export const reevaluateSchema = z.object({
  limitSetKey: z.string().min(1, "Choose a limit set"),
  context: EvaluationContextSchema,
});

export const reviewActionSchema = z
  .object({
    action: z.enum(["submitted", "approved", "sent_back", "comment"]),
    comment: multiLineText().trim().max(4000, "Comment is too long (max 4000)").default(""),
    /** The evaluation the decision is about (required to approve: it must be the newest one). */
    evaluationId: z.uuid("Name the evaluation").optional(),
  })
  .refine((v) => !(v.action === "sent_back" || v.action === "comment") || v.comment.length > 0, {
    path: ["comment"],
    message: "Say why (a reason is required)",
  });

export const createShareSchema = z.object({
  label: singleLineText().trim().max(120).default(""),
  expiresInDays: z.coerce.number().int().min(1, "At least 1 day").max(90, "At most 90 days").default(14),
});

export const captureListQuerySchema = z.object({
  site: z.uuid().optional(),
  verdict: z.enum(["pass", "fail", "incomplete"]).optional(),
  status: z.enum(["uploading", "uploaded", "queued", "running", "done", "failed"]).optional(),
  from: boundedIsoDate().optional(),
  to: boundedIsoDate().optional(),
  page: z.coerce.number().int().min(1).max(100_000, "Page is out of range").default(1),
});

export type RegisterCaptureInput = z.infer<typeof registerCaptureSchema>;
export type CaptureMapping = z.infer<typeof captureMappingSchema>;
export type CaptureSetup = z.infer<typeof captureSetupSchema>;
export type IntervalSetup = z.infer<typeof intervalSetupSchema>;
export type ReviewActionInput = z.infer<typeof reviewActionSchema>;
export type CaptureListQuery = z.infer<typeof captureListQuerySchema>;
