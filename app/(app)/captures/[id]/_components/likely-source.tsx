"use client";

import { FAMILY_LABELS, PARAMETER_LABELS } from "@/lib/frontends/family-labels";
import { formatNumber } from "@/lib/reports/format";
import { useCaptureDiagnosis } from "@/lib/swr/use-mitigation-studies";

/** Which published converter models the channel's measured spectrum resembles, best fit first. */
export function LikelySource({ base, evaluationId, channelName }: { base: string; evaluationId: string | null; channelName: string }) {
  const { data, error, isLoading } = useCaptureDiagnosis(base, evaluationId);
  const dx = data?.diagnosis.channels.find((c) => c.name === channelName);
  return (
    <section className="panel text-sm" data-testid="likely-source" aria-labelledby="likely-source-heading">
      <h2 id="likely-source-heading" className="mb-1">Likely source — {channelName}</h2>
      <p className="mb-2 text-ink-muted">A resemblance between the measured spectrum and published converter models, not a statement of what is installed.</p>
      {isLoading && <p className="text-ink-muted">Fitting models…</p>}
      {error && <p className="text-fail">{error.message}</p>}
      {data && !dx && <p className="text-ink-muted">This channel is not a current channel.</p>}
      {dx && (
        <>
          <p className="mb-2 font-medium" data-testid="likely-source-summary">{dx.summary}</p>
          <table className="w-full text-left">
            <thead className="text-ink-muted">
              <tr>
                <th className="py-1 pr-2">#</th>
                <th className="py-1 pr-2">Front end</th>
                <th className="py-1 pr-2">Fitted parameters</th>
                <th className="py-1 text-right">Fit error, % of I₁</th>
              </tr>
            </thead>
            <tbody>
              {dx.candidates.map((c, k) => (
                <tr key={c.family} className="border-t border-line" data-testid={`candidate-${k}`}>
                  <td className="py-1 pr-2">{k + 1}</td>
                  <td className="py-1 pr-2">{FAMILY_LABELS[c.family]}</td>
                  <td className="py-1 pr-2">
                    {Object.entries(c.parameters)
                      .map(([name, v]) => {
                        // "firing angle 10°", "commutation reactance 12.7 %": the value, then its unit.
                        const p = PARAMETER_LABELS[name] ?? { label: "fitted parameter", unit: "" };
                        return `${p.label} ${formatNumber(v, 3)}${p.unit === "°" ? "°" : p.unit ? ` ${p.unit}` : ""}`;
                      })
                      .join(" · ") || "—"}
                  </td>
                  <td className="py-1 text-right tabular-nums">{c.fitErrorPercent.toFixed(1)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {!dx.usedVoltage && <p className="mt-2 text-ink-muted">No voltage channel is paired with this current, so the displacement angle was not used.</p>}
        </>
      )}
    </section>
  );
}
