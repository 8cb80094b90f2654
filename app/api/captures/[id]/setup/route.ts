import { saveCaptureSetup } from "@/db/queries/captures";
import { captureSetupRoute } from "@/lib/api/capture-setup-route";
import { captureSetupSchema } from "@/lib/validations/capture";

// PUT /api/captures/:id/setup — channel mapping, limit set and evaluation context
export const PUT = captureSetupRoute(captureSetupSchema, saveCaptureSetup);
