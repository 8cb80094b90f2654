import { gzipResponse } from "@/lib/api/gzip-response";
import { withPublic } from "@/lib/api/with-auth";
import { loadSharedChartData } from "@/lib/reports/load-shared-sheet";

// GET /api/shared/:token/charts — chart data for the shared sheet; no session, the token is the key
export const GET = withPublic<{ token: string }>(async ({ req, params }) => {
  return gzipResponse(req, await loadSharedChartData({ token: params.token }), "private, no-store");
});
