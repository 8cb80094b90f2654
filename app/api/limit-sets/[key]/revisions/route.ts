import { NextResponse } from "next/server";
import { z } from "zod";
import { listRevisionsByKey } from "@/db/queries/limit-sets";
import { withAuth } from "@/lib/api/with-auth";
import { limitSetKeySchema } from "@/lib/validations/limit-set";

const paramsSchema = z.object({ key: limitSetKeySchema });

// GET /api/limit-sets/:key/revisions — history, newest first, each with its changes from the previous revision
export const GET = withAuth<{ key: string }>(
  async ({ params }) => NextResponse.json(await listRevisionsByKey(paramsSchema.parse(params))),
  { permission: "limits:read" },
);
