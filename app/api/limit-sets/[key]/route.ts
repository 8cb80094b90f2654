import { NextResponse } from "next/server";
import { z } from "zod";
import { getLimitSetByKey, reviseLimitSetByKey } from "@/db/queries/limit-sets";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { limitSetKeySchema, parseLimitSetBody, reviseLimitSetSchemaFor } from "@/lib/validations/limit-set";

const paramsSchema = z.object({ key: limitSetKeySchema });

// GET /api/limit-sets/:key — one set with its current revision
export const GET = withAuth<{ key: string }>(
  async ({ params }) => NextResponse.json(await getLimitSetByKey(paramsSchema.parse(params))),
  { permission: "limits:read" },
);

// PUT /api/limit-sets/:key — save { content, reason } as the next revision and make it current
export const PUT = withAuth<{ key: string }>(
  async ({ req, user, params }) => {
    const { key } = paramsSchema.parse(params);
    const input = parseLimitSetBody(reviseLimitSetSchemaFor(key), await readJson(req));
    return NextResponse.json(await reviseLimitSetByKey({ key, ...input, actorId: user.id }));
  },
  { permission: "limits:write" },
);
