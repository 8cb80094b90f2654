import { z } from "zod";
import { multiLineText, singleLineText } from "./text";

const optionalPositive = (label: string) =>
  z.preprocess(
    (v) => (v === "" || v === null || v === undefined ? null : v),
    z.coerce.number({ error: `${label} must be a number` }).positive(`${label} must be greater than zero`).nullable(),
  );

// Shared by the site form, the route handlers and the SWR hook.
export const siteInputSchema = z
  .object({
    name: singleLineText().trim().min(2, "Name needs at least 2 characters").max(120, "Name is too long (max 120)"),
    address: multiLineText().trim().max(300, "Address is too long (max 300)").default(""),
    nominalVoltageV: z.coerce
      .number({ error: "Nominal voltage must be a number" })
      .positive("Nominal voltage must be greater than zero")
      .max(1_000_000, "Nominal voltage above 1 MV is not plausible"),
    frequencyHz: z.coerce.number({ error: "Frequency must be 50 or 60 Hz" }).refine((f) => f === 50 || f === 60, "Frequency must be 50 or 60 Hz"),
    iscA: optionalPositive("Isc"),
    ilA: optionalPositive("IL"),
    notes: multiLineText().trim().max(4000, "Notes are too long (max 4000)").default(""),
  })
  .refine((s) => s.iscA == null || s.ilA == null || s.iscA > s.ilA, {
    path: ["iscA"],
    message: "Isc must be larger than IL (the short-circuit current exceeds the load current)",
  });

export type SiteInput = z.infer<typeof siteInputSchema>;
