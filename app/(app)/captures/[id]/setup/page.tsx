import { forbidden } from "next/navigation";
import { getCaptureById, listLimitSetChoices } from "@/db/queries/captures";
import { getSiteById } from "@/db/queries/sites";
import { orNotFound, requirePage, uuidOr404 } from "@/lib/auth/page";
import { canEditCapture } from "@/lib/auth/permissions";
import { IntervalMappingSchema } from "@/lib/intervals/types";
import { captureMappingSchema, intervalSetupMappingSchema } from "@/lib/validations/capture";
import { IntervalMappingForm } from "./interval-mapping-form";
import { EvaluationContextSchema } from "@/lib/compliance/model";
import { voltageContextFromSystem } from "@/lib/pipeline/voltage-context-from-system";
import { MappingForm } from "./mapping-form";

export const metadata = { title: "Map channels" };

export default async function CaptureSetupPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePage("captures:upload");
  const { id } = await params;
  uuidOr404(id);
  const capture = await orNotFound(getCaptureById({ id, reader: user }));
  if (!canEditCapture(user, capture)) forbidden();
  const [site, limitSets] = await Promise.all([getSiteById({ id: capture.siteId, reader: user }), listLimitSetChoices()]);
  const mapping = captureMappingSchema.safeParse(capture.mapping ?? {});
  const context = EvaluationContextSchema.safeParse(capture.context ?? {});
  const stored = intervalSetupMappingSchema.safeParse(capture.mapping ?? {});
  const remembered = IntervalMappingSchema.safeParse(site.intervalMapping ?? null);
  const savedInterval = stored.success ? stored.data.intervalMapping : remembered.success ? remembered.data : null;
  // Prefill from the site: its PCC data and the usual limit set for it.
  const siteDefaults = {
    limitSetKey: site.iscA && site.ilA ? "ieee-519-2014-current" : "iec-61000-3-2-class-a",
    context: {
      ...(site.iscA ? { iscA: site.iscA } : {}),
      ...(site.ilA ? { ilA: site.ilA } : {}),
      // The site's (system) nominal voltage gives the bus voltage and the channels' nominal voltage.
      ...voltageContextFromSystem(site.nominalVoltageV, {}),
    },
  };
  return (
    <div className="space-y-4">
      <div>
        <h1>{capture.kind === "interval-log" ? "Map columns" : "Map channels"} — {capture.title}</h1>
        <p className="text-sm text-ink-soft">
          {site.name} · {capture.originalFilename} · {(capture.sizeBytes / 1024 / 1024).toFixed(2)} MB
        </p>
      </div>
      {capture.status === "failed" && capture.failureReason && (
        <p className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert" data-testid="failure-reason">
          The last analysis failed: {capture.failureReason}
        </p>
      )}
      {capture.kind === "interval-log" ? (
        <IntervalMappingForm
          captureId={capture.id}
          limitSets={limitSets}
          savedMapping={savedInterval}
          initialLimitSetKey={capture.limitSetKey ?? siteDefaults.limitSetKey}
          initialContext={capture.context && context.success ? context.data : siteDefaults.context}
        />
      ) : (
      <MappingForm
        captureId={capture.id}
        limitSets={limitSets}
        initialMapping={mapping.success ? mapping.data : { channels: {} }}
        initialLimitSetKey={capture.limitSetKey ?? siteDefaults.limitSetKey}
        initialContext={capture.context && context.success ? context.data : siteDefaults.context}
        siteFrequencyHz={site.frequencyHz}
      />
      )}
    </div>
  );
}
