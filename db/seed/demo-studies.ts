// The demo scenario's saved mitigation studies: on the failing compressor-drive capture, a 5 % line
// reactor on each drive (predicted still to fail IEEE 519) against a 4.7th-tuned filter at the
// 11 kV PCC (predicted to pass). Idempotent: a study whose title exists on the capture is skipped.
import "server-only";
import { systemReader } from "@/lib/auth/permissions";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { insertMitigationStudy } from "@/db/queries/studies";
import { captures, mitigationStudies } from "@/db/schema";
import { computeMitigationStudy } from "@/lib/captures/mitigation-study";
import type { MitigationStudyInputs } from "@/lib/mitigation/study-inputs";

export const demoStudies: { captureTitle: string; title: string; inputs: MitigationStudyInputs }[] = [
  {
    captureTitle: "Compressor drives at full load — before filter",
    title: "5 % line reactor on each drive",
    inputs: { mitigations: [{ kind: "reactor", percent: 5 }] },
  },
  {
    captureTitle: "Compressor drives at full load — before filter",
    title: "4.7th filter, 3 Mvar at the 11 kV PCC",
    inputs: { mitigations: [{ kind: "passive-filter", tuningOrder: 4.7, kvar: 3000, q: 30 }] },
  },
];

/** Saves the demo studies as the demo engineer (included in the PDF report). */
export async function seedDemoStudies({ engineerId }: { engineerId: string }): Promise<void> {
  for (const demo of demoStudies) {
    const [capture] = await db.select({ id: captures.id }).from(captures).where(eq(captures.title, demo.captureTitle));
    if (!capture) continue;
    const [exists] = await db
      .select({ id: mitigationStudies.id })
      .from(mitigationStudies)
      .where(and(eq(mitigationStudies.captureId, capture.id), eq(mitigationStudies.title, demo.title)));
    if (exists) continue;
    const { analysisId, evaluationId, result } = await computeMitigationStudy({ captureId: capture.id, reader: systemReader, inputs: demo.inputs });
    await insertMitigationStudy({ captureId: capture.id, analysisId, evaluationId, title: demo.title, inputs: demo.inputs, result, includeInReport: true, actorId: engineerId });
    console.log(`[ordwise] demo study: ${demo.title} → predicted ${result.compliance?.verdict ?? "not judged"}`);
  }
}
