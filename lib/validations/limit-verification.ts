import { z } from "zod";

// An admin's record that a limit-set revision was checked against the printed standard.
export const limitVerificationSchema = z.object({
  edition: z.string().trim().min(3, "Name the printed edition you checked against (e.g. IEC 61000-3-2:2018)").max(160, "Edition is too long (max 160)"),
  checked: z.string().trim().min(2, "Name the clause or table you checked (e.g. Table 1)").max(160, "Too long (max 160)"),
  verifiedOn: z.iso.date("Give the date as YYYY-MM-DD"),
  note: z.string().trim().max(2000, "Note is too long (max 2000)").default(""),
});

export type LimitVerificationInput = z.infer<typeof limitVerificationSchema>;
