import Link from "next/link";
import { z } from "zod";
import { SafetyNote } from "@/app/_components/safety-note";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import { listCaptures } from "@/db/queries/captures";
import { requirePage } from "@/lib/auth/page";
import type { Reader } from "@/lib/auth/permissions";
import { loadSheet, type Sheet } from "@/lib/captures/load-sheet";
import type { ChannelCompliance, ComplianceRow } from "@/lib/compliance/result";
import { AppError } from "@/lib/errors";
import { formatNumber, formatPercent, formatWhen, summariseContext } from "@/lib/reports/format";
import { CompareSpectrum } from "./compare-spectrum";

export const metadata = { title: "Compare captures" };

const querySchema = z.object({ a: z.uuid().optional(), b: z.uuid().optional(), channel: z.string().max(200).optional(), hide: z.literal("below-threshold").optional() });

async function sheetOrNull(id: string | undefined, reader: Reader): Promise<Sheet | null> {
  if (!id) return null;
  try {
    return await loadSheet({ captureId: id, reader });
  } catch (err) {
    if (err instanceof AppError && err.code === "not_found") return null;
    throw err;
  }
}

function channelsOf(sheet: Sheet): ChannelCompliance[] {
  const r = sheet.evaluation?.result;
  if (!r) return [];
  if (r.channels.length > 0) return r.channels;
  return [{ channel: r.channel ?? "—", phase: null, band: r.band, rows: r.rows, aggregates: r.aggregates, conditions: r.conditions, verdict: r.verdict, derived: { notes: [] } }];
}

const judged = (r: ComplianceRow | undefined) => r?.verdict === "pass" || r?.verdict === "fail";

function change(a: ComplianceRow | undefined, b: ComplianceRow | undefined): { text: string; tone: string } {
  if (a?.measured == null || b?.measured == null) return { text: "—", tone: "" };
  const delta = b.measured - a.measured;
  // Orders disregarded on both sides are measurement noise: show the difference, not a trend.
  if (!judged(a) && !judged(b)) return { text: `${delta > 0 ? "+" : ""}${formatNumber(delta)}`, tone: "text-ink-muted" };
  const pct = a.measured !== 0 ? (delta / a.measured) * 100 : null;
  const sign = delta > 0 ? "+" : "";
  const text = `${sign}${formatNumber(delta)}${pct !== null ? ` (${sign}${pct.toFixed(0)} %)` : ""}`;
  return { text, tone: delta < 0 ? "text-pass" : delta > 0 ? "text-fail" : "" };
}

/** Two captures of one site order by order (e.g. before and after a filter), for one channel. */
export default async function ComparePage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePage("captures:read");
  const raw = await searchParams;
  const parsed = querySchema.safeParse(Object.fromEntries(Object.entries(raw).filter(([, v]) => typeof v === "string" && v !== "")));
  const query = parsed.success ? parsed.data : {};
  const [a, b] = await Promise.all([sheetOrNull(query.a, user), sheetOrNull(query.b, user)]);

  if (!a || !a.evaluation) {
    return (
      <div className="max-w-xl space-y-3">
        <h1>Compare captures</h1>
        <p className="panel text-sm text-ink-soft" data-testid="compare-missing">
          Open an analysed capture and use “Compare with…” to choose the second one.
        </p>
        <Link href="/captures" className="btn-quiet">Captures</Link>
      </div>
    );
  }

  const siblings = await listCaptures({ query: { site: a.capture.siteId, status: "done", page: 1 }, reader: user });
  const others = siblings.items.filter((c) => c.id !== a.capture.id);
  const picker = (
    <form action="/captures/compare" method="get" className="panel flex flex-wrap items-end gap-3" data-testid="compare-form">
      <input type="hidden" name="a" value={a.capture.id} />
      <div className="min-w-0 flex-1">
        <label htmlFor="compare-b" className="field-label">Compare “{a.capture.title}” with</label>
        <select id="compare-b" name="b" defaultValue={b?.capture.id} className="field-input">
          {others.map((c) => (
            <option key={c.id} value={c.id}>{c.title} ({c.createdAt.toISOString().slice(0, 10)})</option>
          ))}
        </select>
      </div>
      <button type="submit" className="btn-quiet">Compare</button>
    </form>
  );

  if (!b || !b.evaluation) {
    return (
      <div className="space-y-4">
        <h1>Compare captures</h1>
        {others.length > 0 ? picker : <p className="panel text-sm text-ink-soft">No other analysed capture of {a.site.name} yet.</p>}
        {query.b && <p className="text-sm text-fail">The second capture was not found or is not analysed.</p>}
      </div>
    );
  }
  if (a.capture.siteId !== b.capture.siteId) {
    return (
      <div className="space-y-4">
        <h1>Compare captures</h1>
        <p className="rounded-md border border-fail/40 bg-fail-light px-4 py-2 text-sm text-fail" role="alert" data-testid="compare-other-site">
          The two captures belong to different sites; only captures of one site are compared.
        </p>
        {others.length > 0 && picker}
      </div>
    );
  }

  const channelsA = channelsOf(a);
  const channelsB = channelsOf(b);
  const names = [...new Set([...channelsA.map((c) => c.channel), ...channelsB.map((c) => c.channel)])];
  const channel = query.channel && names.includes(query.channel) ? query.channel : (channelsA[0]?.channel ?? names[0] ?? "");
  const ca = channelsA.find((c) => c.channel === channel);
  const cb = channelsB.find((c) => c.channel === channel);
  const rowA = new Map((ca?.rows ?? []).map((r) => [r.order, r]));
  const rowB = new Map((cb?.rows ?? []).map((r) => [r.order, r]));
  const hideBelow = query.hide === "below-threshold";
  const belowInBoth = (o: number) => rowA.get(o)?.verdict === "below-threshold" && rowB.get(o)?.verdict === "below-threshold";
  const orders = [...new Set([...(ca?.rows ?? []), ...(cb?.rows ?? [])].map((r) => r.order))]
    .sort((x, y) => x - y)
    .filter((o) => !hideBelow || !belowInBoth(o));
  const hiddenCount = hideBelow ? new Set([...(ca?.rows ?? []), ...(cb?.rows ?? [])].map((r) => r.order)).size - orders.length : 0;
  const sameLimits = a.evaluation.limitSetKey === b.evaluation.limitSetKey && a.evaluation.revisionNumber === b.evaluation.revisionNumber;
  const href = (ch: string, hide = hideBelow) =>
    `/captures/compare?${new URLSearchParams({ a: a.capture.id, b: b.capture.id, channel: ch, ...(hide ? { hide: "below-threshold" } : {}) })}`;

  return (
    <div className="space-y-4">
      <nav className="text-sm text-ink-soft" aria-label="Breadcrumb">
        <Link href="/captures" className="hover:text-copper">Captures</Link> / compare
      </nav>
      <h1>Compare captures · {a.site.name}</h1>
      <div className="grid gap-3 sm:grid-cols-2">
        {[
          { tag: "A", s: a },
          { tag: "B", s: b },
        ].map(({ tag, s }) => (
          <section key={tag} className="panel min-w-0 text-sm" data-testid={`compare-${tag.toLowerCase()}`}>
            <p className="text-xs uppercase tracking-wide text-ink-muted">Capture {tag}</p>
            <div className="flex flex-wrap items-center justify-between gap-2">
              <Link href={`/captures/${s.capture.id}`} className="font-semibold hover:text-copper">{s.capture.title}</Link>
              <VerdictBadge verdict={s.evaluation!.result.verdict} />
            </div>
            <p className="text-ink-soft">
              {s.capture.capturedAt ? `captured ${formatWhen(s.capture.capturedAt)}` : `uploaded ${formatWhen(s.capture.createdAt)}`}
            </p>
            <p className="text-ink-soft">
              {s.evaluation!.limitSetName} · revision {s.evaluation!.revisionNumber} · {summariseContext(s.evaluation!.result.context)}
            </p>
          </section>
        ))}
      </div>
      {!sameLimits && (
        <p className="rounded-md border border-caution/40 bg-caution-light px-4 py-2 text-sm text-caution" role="status">
          The two latest evaluations use different limit sets or revisions; compare measured values, and read % of limit against each one's own limits.
        </p>
      )}
      {others.length > 1 && picker}
      {names.length > 1 && (
        <div className="flex flex-wrap items-center gap-2 text-sm" data-testid="compare-channels">
          <span className="text-ink-soft">Channel</span>
          {names.map((n) => (
            <Link key={n} href={href(n)} aria-current={n === channel ? "true" : undefined} className={`rounded-md border px-2.5 py-1.5 ${n === channel ? "border-copper bg-copper-light font-semibold" : "border-line bg-paper-raised hover:bg-paper-sunk"}`}>
              {n}
            </Link>
          ))}
        </div>
      )}
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <Link href={href(channel, !hideBelow)} className="btn-quiet py-1" data-testid="compare-hide-below" aria-pressed={hideBelow}>
          {hideBelow ? "Show every order" : "Hide orders below threshold in both"}
        </Link>
        {hideBelow && <span className="text-ink-soft">{hiddenCount} order{hiddenCount === 1 ? "" : "s"} below threshold in both hidden.</span>}
      </p>
      <CompareSpectrum orders={orders} rowA={rowA} rowB={rowB} unit={ca?.rows[0]?.unit ?? cb?.rows[0]?.unit ?? ""} />
      <section className="panel overflow-x-auto p-0 sm:p-0">
        <table className="table-base min-w-[44rem]" data-testid="compare-table">
          <thead>
            <tr>
              <th>Order</th>
              <th className="text-right">A measured</th>
              <th className="text-right">A % of limit</th>
              <th className="text-right">B measured</th>
              <th className="text-right">B % of limit</th>
              <th className="text-right">Change B − A</th>
              <th>Verdicts A → B</th>
            </tr>
          </thead>
          <tbody className="tabular-nums">
            {orders.map((order) => {
              const ra = rowA.get(order);
              const rb = rowB.get(order);
              const c = change(ra, rb);
              return (
                <tr key={order} data-testid={`compare-row-${order}`}>
                  <td className="font-semibold">h{order}</td>
                  <td className="text-right">{formatNumber(ra?.measured)} <span className="text-ink-muted">{ra?.unit}</span></td>
                  <td className="text-right">{formatPercent(ra?.percentOfLimit)}</td>
                  <td className="text-right">{formatNumber(rb?.measured)} <span className="text-ink-muted">{rb?.unit}</span></td>
                  <td className="text-right">{formatPercent(rb?.percentOfLimit)}</td>
                  <td className={`text-right font-medium ${c.tone}`}>{c.text}</td>
                  <td className="whitespace-nowrap">
                    {ra ? <VerdictBadge verdict={ra.verdict} /> : "—"} <span aria-hidden>→</span> {rb ? <VerdictBadge verdict={rb.verdict} /> : "—"}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </section>
      <p className="text-xs text-ink-muted">
        Change is B minus A in the unit of the row (negative means B is lower); the percentage is relative to A. Orders disregarded in both captures are shown in grey.
      </p>
      <div className="rounded-md border border-caution/30 bg-caution-light/50 px-3 py-2">
        <SafetyNote />
      </div>
    </div>
  );
}
