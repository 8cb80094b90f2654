import { NextResponse } from "next/server";
import { importLimitSet } from "@/db/queries/limit-sets";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { importLimitSetSchema, parseLimitSetBody } from "@/lib/validations/limit-set";

// POST /api/limit-sets/import — import an exported set: a new revision of an existing key, or a new custom set
export const POST = withAuth(
  async ({ req, user }) => {
    const input = parseLimitSetBody(importLimitSetSchema, await readJson(req));
    const result = await importLimitSet({ ...input, actorId: user.id });
    return NextResponse.json(result, { status: result.created ? 201 : 200 });
  },
  { permission: "limits:write" },
);
