import { z } from "zod";

export const captureParamsSchema = z.object({ id: z.uuid("Not a capture id") });
export const shareParamsSchema = z.object({ id: z.uuid("Not a capture id"), shareId: z.uuid("Not a share link id") });
