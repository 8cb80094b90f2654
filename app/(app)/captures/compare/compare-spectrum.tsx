import type { ComplianceRow } from "@/lib/compliance/result";
import { formatNumber } from "@/lib/reports/format";

/**
 * Both captures' spectra side by side with each one's limit marks, drawn as SVG on the server
 * (the table beside it carries the same numbers for readers who cannot see the chart).
 */
export function CompareSpectrum({ orders, rowA, rowB, unit }: { orders: number[]; rowA: Map<number, ComplianceRow>; rowB: Map<number, ComplianceRow>; unit: string }) {
  const shown = orders.filter((o) => o > 1);
  if (shown.length === 0) return null;
  const values = shown.flatMap((o) => [rowA.get(o)?.measured, rowA.get(o)?.limit, rowB.get(o)?.measured, rowB.get(o)?.limit]).filter((v): v is number => typeof v === "number" && Number.isFinite(v));
  const top = Math.max(...values, 1e-9) * 1.1;
  const width = 720;
  const height = 220;
  const pad = { left: 44, right: 8, top: 8, bottom: 22 };
  const slot = (width - pad.left - pad.right) / shown.length;
  const bar = Math.max(1.5, slot * 0.34);
  const y = (v: number) => pad.top + (height - pad.top - pad.bottom) * (1 - v / top);
  const failing = (r?: ComplianceRow) => r?.verdict === "fail";
  return (
    <figure className="panel min-w-0" data-testid="compare-spectrum">
      <svg viewBox={`0 0 ${width} ${height}`} className="h-auto w-full" role="img" aria-label={`Spectra of A and B in ${unit} with their limits, orders ${shown[0]} to ${shown.at(-1)}`}>
        <line x1={pad.left} x2={width - pad.right} y1={y(0)} y2={y(0)} stroke="#ddd6ca" />
        {[0.5, 1].map((f) => (
          <g key={f}>
            <line x1={pad.left} x2={width - pad.right} y1={y(top * f / 1.1)} y2={y(top * f / 1.1)} stroke="#f0ece4" />
            <text x={pad.left - 4} y={y(top * f / 1.1) + 3} fontSize="10" textAnchor="end" fill="#5a6677">{formatNumber((top * f) / 1.1)}</text>
          </g>
        ))}
        {shown.map((o, i) => {
          const x = pad.left + i * slot + slot / 2;
          const a = rowA.get(o);
          const b = rowB.get(o);
          return (
            <g key={o}>
              {a?.measured != null && <rect x={x - bar - 0.5} y={y(a.measured)} width={bar} height={Math.max(0, y(0) - y(a.measured))} fill={failing(a) ? "#b3261e" : "#3c4b5e"} />}
              {b?.measured != null && <rect x={x + 0.5} y={y(b.measured)} width={bar} height={Math.max(0, y(0) - y(b.measured))} fill={failing(b) ? "#e0786f" : "#b4582a"} />}
              {a?.limit != null && <line x1={x - bar - 1.5} x2={x - 0.5} y1={y(a.limit)} y2={y(a.limit)} stroke="#1d2a3a" strokeWidth="2" />}
              {b?.limit != null && <line x1={x + 0.5} x2={x + bar + 1.5} y1={y(b.limit)} y2={y(b.limit)} stroke="#8f4320" strokeWidth="2" />}
              {(shown.length <= 25 || o % 5 === 0 || i === 0) && <text x={x} y={height - 8} fontSize="10" textAnchor="middle" fill="#5a6677">{o}</text>}
            </g>
          );
        })}
      </svg>
      <figcaption className="mt-1 text-xs text-ink-soft">
        Bars: measured {unit} per order — dark: A, copper: B (red where over the limit). Short lines: each capture&apos;s limit for that order.
      </figcaption>
    </figure>
  );
}
