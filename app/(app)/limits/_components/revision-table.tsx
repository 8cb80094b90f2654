// Read-only rendering of one revision's content: per band its applicability, order rows and
// aggregates, then the rules. Used for the current revision and for old revisions.
import type { AggregateRow, Band, LimitSetRevisionContent, OrderRow, Range, Rules } from "@/lib/compliance/model";
import { describeRange } from "@/lib/compliance/select-band";

const basisLabels: Record<string, string> = {
  A: "A",
  "mA/W": "mA/W",
  "%I1": "% of I1",
  "%V1": "% of V1",
  "%IL": "% of IL",
  "%Iref": "% of Iref",
  "%Vnom": "% of Vnom",
};

function orders(from: number, to: number): string {
  return from === to ? String(from) : `${from}–${to}`;
}

function applicabilityText(band: Band): string[] {
  const a = band.applicability;
  const out: string[] = [];
  const add = (r: Range | undefined, name: string, unit = "") => r && out.push(describeRange(r, name, unit));
  add(a.iscOverIl, "Isc/IL");
  add(a.busVoltageV, "bus voltage", " V");
  add(a.rsce, "Rsce");
  add(a.ratedPowerW, "rated power", " W");
  if (a.phaseConfig) out.push(a.phaseConfig.join(" or "));
  if (band.generatorBand) out.push("power-generation equipment");
  return out;
}

function limitCell(row: Pick<OrderRow, "limit" | "formula">) {
  return row.formula !== undefined ? <code className="font-mono text-xs">{row.formula}</code> : <span className="tabular-nums">{row.limit}</span>;
}

function capCell(row: OrderRow) {
  if (row.capFormulaA !== undefined) return <code className="font-mono text-xs">{row.capFormulaA} A</code>;
  if (row.capA !== undefined) return <span className="tabular-nums">{row.capA} A</span>;
  return <span className="text-ink-muted">—</span>;
}

function aggregateLimit(a: AggregateRow) {
  if (a.fromOrderLimits) return <span>from the order limits</span>;
  return limitCell(a);
}

function OrderRowsTable({ band, bandIndex }: { band: Band; bandIndex: number }) {
  return (
    <div className="overflow-x-auto">
      <table className="table-base" data-testid={`order-rows-${bandIndex}`}>
        <thead>
          <tr>
            <th>#</th>
            <th>Orders</th>
            <th>Parity</th>
            <th>Limit</th>
            <th>Basis</th>
            <th>Cap</th>
            <th className="hidden md:table-cell">Source / note</th>
          </tr>
        </thead>
        <tbody>
          {band.orderRows.map((row, i) => (
            <tr key={i} data-testid={`row-${bandIndex}-${i}`}>
              <td className="text-ink-muted">{i + 1}</td>
              <td className="whitespace-nowrap tabular-nums">{orders(row.from, row.to)}</td>
              <td>{row.parity}</td>
              <td data-testid={`cell-${bandIndex}-${i}-limit`}>{limitCell(row)}</td>
              <td className="whitespace-nowrap">{basisLabels[row.basis] ?? row.basis}</td>
              <td className="whitespace-nowrap">{capCell(row)}</td>
              <td className="hidden max-w-xs text-xs text-ink-muted md:table-cell">
                {[row.note, row.source].filter(Boolean).join(" · ")}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function AggregatesTable({ band, bandIndex }: { band: Band; bandIndex: number }) {
  return (
    <div className="overflow-x-auto">
      <table className="table-base" data-testid={`aggregates-${bandIndex}`}>
        <thead>
          <tr>
            <th>Name</th>
            <th>Orders</th>
            <th>Parity</th>
            <th>Weight</th>
            <th>Limit</th>
            <th>Basis</th>
            <th>Role</th>
          </tr>
        </thead>
        <tbody>
          {band.aggregates.map((a, i) => (
            <tr key={i}>
              <td className="font-medium">{a.name}</td>
              <td className="whitespace-nowrap tabular-nums">{orders(a.from, a.to)}</td>
              <td>{a.parity}</td>
              <td>{a.weighting === "order" ? "× h" : "—"}</td>
              <td>{aggregateLimit(a)}</td>
              <td className="whitespace-nowrap">{basisLabels[a.basis] ?? a.basis}</td>
              <td>{a.role === "requirement" ? "requirement" : "allowance condition"}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function RulesList({ rules }: { rules: Rules }) {
  const items: [string, string][] = [
    ["At the limit", `${rules.comparison.passAtLimit ? "passes" : "fails"} — ${rules.comparison.source}`],
  ];
  if (rules.threshold) {
    items.push(["Threshold", `below max(${rules.threshold.percentOfInputCurrent} % of input current, ${rules.threshold.minimumA} A) disregarded — ${rules.threshold.source}`]);
  }
  if (rules.interpolation) {
    items.push(["Interpolation", `${rules.interpolation.method} in ${rules.interpolation.variable}, ${rules.interpolation.defaultOn ? "on" : "off"} by default — ${rules.interpolation.source}`]);
  }
  if (rules.pohcAllowance) {
    const p = rules.pohcAllowance;
    items.push(["POHC allowance", `${p.parity} orders ${p.from}–${p.to} × ${p.factor} if ${p.aggregate} passes — ${p.source}`]);
  }
  for (const t of rules.timeRules ?? []) {
    const statistic = t.statistic === "percentile" ? `${t.percentile}th percentile` : t.statistic;
    const values = t.intervalS === 0 ? "window values" : `${t.intervalS} s values`;
    const period = t.accumulationS ? ` per ${t.accumulationS / 3600} h` : "";
    items.push([t.label, `${statistic} of ${values}${period} ≤ ${t.multiplier} × limit (${t.appliesTo})${t.source ? ` — ${t.source}` : ""}`]);
  }
  return (
    <dl className="space-y-2 text-sm" data-testid="rules">
      {items.map(([term, text], i) => (
        <div key={i} className="sm:grid sm:grid-cols-[9rem_1fr] sm:gap-3">
          <dt className="font-medium text-ink-soft">{term}</dt>
          <dd className="break-words">{text}</dd>
        </div>
      ))}
    </dl>
  );
}

export function RevisionTable({ content }: { content: LimitSetRevisionContent }) {
  return (
    <div className="space-y-4" data-testid="revision-table">
      <section className="panel space-y-1 text-sm">
        <p>
          <span className="font-medium">{content.standard}</span> · {content.edition} · {content.scope} · {content.quantity}
        </p>
        <p className="text-ink-soft">{content.description}</p>
        <p className="text-ink-muted">Applies to: {content.appliesTo}</p>
      </section>
      <section className="panel text-sm" data-testid="limit-set-notes" aria-labelledby="limit-set-notes-heading">
        <h2 id="limit-set-notes-heading" className="mb-2">Interpretation notes</h2>
        {content.notes && content.notes.length > 0 ? (
          <>
            <p className="mb-2 text-ink-muted">Printed once under Notes on every sheet and PDF judged with this revision.</p>
            <ul className="list-disc space-y-1 pl-5">
              {content.notes.map((note) => <li key={note}>{note}</li>)}
            </ul>
          </>
        ) : (
          <p className="text-ink-muted">This revision has no interpretation notes.</p>
        )}
      </section>
      {content.bands.map((band, b) => {
        const applies = applicabilityText(band);
        return (
          <section key={b} className="panel space-y-3" data-testid={`band-${b}`}>
            <div>
              <h2>
                {band.label}
                {band.option && <span className="ml-2 text-sm font-normal text-ink-muted">({band.option.group}: {band.option.label})</span>}
              </h2>
              {band.description && <p className="text-sm text-ink-soft">{band.description}</p>}
              <p className="mt-1 text-sm">
                <span className="text-ink-muted">Applies when: </span>
                {applies.length > 0 ? applies.join(" · ") : "always"}
              </p>
              {band.conditions.length > 0 && (
                <ul className="mt-1 list-disc pl-5 text-sm text-ink-soft">
                  {band.conditions.map((c) => (
                    <li key={c.id}>{c.text}</li>
                  ))}
                </ul>
              )}
            </div>
            {band.exempt ? (
              <p className="rounded bg-idle-light px-3 py-2 text-sm">No limits apply in this band.</p>
            ) : (
              <>
                {band.orderRows.length > 0 && <OrderRowsTable band={band} bandIndex={b} />}
                {band.aggregates.length > 0 && (
                  <div>
                    <h3 className="mb-1 text-sm font-semibold">Aggregates</h3>
                    <AggregatesTable band={band} bandIndex={b} />
                  </div>
                )}
              </>
            )}
          </section>
        );
      })}
      <section className="panel">
        <h2 className="mb-2">Rules</h2>
        <RulesList rules={content.rules} />
      </section>
    </div>
  );
}
