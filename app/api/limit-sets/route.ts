import { NextResponse } from "next/server";
import { listLimitSets } from "@/db/queries/limit-sets";
import { withAuth } from "@/lib/api/with-auth";

// GET /api/limit-sets — every limit set with its current revision number
export const GET = withAuth(async () => NextResponse.json({ limitSets: await listLimitSets() }), { permission: "limits:read" });
