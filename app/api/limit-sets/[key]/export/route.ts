import { NextResponse } from "next/server";
import { z } from "zod";
import { exportLimitSetByKey } from "@/db/queries/limit-sets";
import { withAuth } from "@/lib/api/with-auth";
import { limitSetKeySchema } from "@/lib/validations/limit-set";

const paramsSchema = z.object({ key: limitSetKeySchema });

// GET /api/limit-sets/:key/export — the set as a JSON download { key, name, content }, importable as is
export const GET = withAuth<{ key: string }>(
  async ({ params }) => {
    const doc = await exportLimitSetByKey(paramsSchema.parse(params));
    return new NextResponse(JSON.stringify(doc, null, 2) + "\n", {
      headers: {
        "content-type": "application/json; charset=utf-8",
        "content-disposition": `attachment; filename="${doc.key}.json"`,
      },
    });
  },
  { permission: "limits:read" },
);
