import { NextResponse } from "next/server";
import { withPublic } from "@/lib/api/with-auth";
import { loadSharedChartData } from "@/lib/reports/load-shared-sheet";

// GET /api/shared/:token/charts — chart data for the shared sheet; no session, the token is the key
export const GET = withPublic<{ token: string }>(async ({ params }) => {
  return NextResponse.json(await loadSharedChartData({ token: params.token }), { headers: { "cache-control": "private, no-store" } });
});
