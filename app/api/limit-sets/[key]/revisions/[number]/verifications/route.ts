import { NextResponse } from "next/server";
import { z } from "zod";
import { listRevisionVerifications, verifyRevision } from "@/db/queries/limit-verifications";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { limitSetKeySchema, revisionNumberSchema } from "@/lib/validations/limit-set";
import { limitVerificationSchema } from "@/lib/validations/limit-verification";

const paramsSchema = z.object({ key: limitSetKeySchema, number: revisionNumberSchema });

// GET /api/limit-sets/:key/revisions/:number/verifications — who checked this revision against the printed standard, newest first
export const GET = withAuth<{ key: string; number: string }>(
  async ({ params }) => NextResponse.json({ verifications: await listRevisionVerifications(paramsSchema.parse(params)) }),
  { permission: "limits:read" },
);

// POST /api/limit-sets/:key/revisions/:number/verifications — an admin who holds the edition records a verification (admin)
export const POST = withAuth<{ key: string; number: string }>(
  async ({ req, params, user }) => {
    const { key, number } = paramsSchema.parse(params);
    const input = limitVerificationSchema.parse(await readJson(req));
    return NextResponse.json({ verification: await verifyRevision({ key, number, input, actor: user }) }, { status: 201 });
  },
  { permission: "limits:write" },
);
