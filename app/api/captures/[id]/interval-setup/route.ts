import { saveIntervalSetup } from "@/db/queries/captures";
import { captureSetupRoute } from "@/lib/api/capture-setup-route";
import { intervalSetupSchema } from "@/lib/validations/capture";

// PUT /api/captures/:id/interval-setup — an interval log's column mapping (remembered for the site), limit set and context
export const PUT = captureSetupRoute(intervalSetupSchema, saveIntervalSetup);
