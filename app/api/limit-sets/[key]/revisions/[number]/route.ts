import { NextResponse } from "next/server";
import { z } from "zod";
import { getRevisionByKeyAndNumber } from "@/db/queries/limit-sets";
import { withAuth } from "@/lib/api/with-auth";
import { limitSetKeySchema, revisionNumberSchema } from "@/lib/validations/limit-set";

const paramsSchema = z.object({ key: limitSetKeySchema, number: revisionNumberSchema });

// GET /api/limit-sets/:key/revisions/:number — one revision, current or old, read-only
export const GET = withAuth<{ key: string; number: string }>(
  async ({ params }) => NextResponse.json(await getRevisionByKeyAndNumber(paramsSchema.parse(params))),
  { permission: "limits:read" },
);
