import { z } from "zod";

/** One mitigation as the app sends it (the same shapes as lib/mitigation/types.ts Mitigation). */
export const MitigationSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("reactor"), percent: z.number().gt(0, "reactor must be above 0 %").max(20, "reactor at most 20 %") }),
  z.object({ kind: z.literal("dc-choke"), percent: z.number().gt(0, "DC choke must be above 0 %").max(20, "DC choke at most 20 %") }),
  z.object({ kind: z.literal("multi-pulse"), pulses: z.union([z.literal(12), z.literal(18)]), imbalancePercent: z.number().min(0).max(20).default(2) }),
  z.object({
    kind: z.literal("passive-filter"),
    tuningOrder: z.number().gt(1, "tuning order above 1").max(50),
    kvar: z.number().positive("kvar must be positive"),
    q: z.number().positive().max(500).default(30),
  }),
  z.object({
    kind: z.literal("active-filter"),
    ratingA: z.number().positive("rating must be positive"),
    fromOrder: z.number().int().min(2).max(50).default(2),
    toOrder: z.number().int().min(2).max(50).default(50),
  }),
]);

/** What a study is computed from: the mitigations in order, optional PCC data, one channel or all. */
export const MitigationStudyInputsSchema = z.object({
  mitigations: z.array(MitigationSchema).min(1, "pick at least one mitigation").max(6),
  network: z
    .object({ busVoltageV: z.number().positive().optional(), iscA: z.number().positive().optional(), xOverR: z.number().positive().max(100).optional() })
    .optional(),
  channel: z.string().min(1).max(200).optional(),
});

export type MitigationStudyInputs = z.infer<typeof MitigationStudyInputsSchema>;
