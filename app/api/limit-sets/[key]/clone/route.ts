import { NextResponse } from "next/server";
import { z } from "zod";
import { cloneLimitSetByKey } from "@/db/queries/limit-sets";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { cloneLimitSetSchema, limitSetKeySchema } from "@/lib/validations/limit-set";

const paramsSchema = z.object({ key: limitSetKeySchema });

// POST /api/limit-sets/:key/clone — copy the current content into a new custom set { key, name }
export const POST = withAuth<{ key: string }>(
  async ({ req, user, params }) => {
    const { key } = paramsSchema.parse(params);
    const input = cloneLimitSetSchema.parse(await readJson(req));
    return NextResponse.json(await cloneLimitSetByKey({ key, newKey: input.key, name: input.name, actorId: user.id }), { status: 201 });
  },
  { permission: "limits:write" },
);
