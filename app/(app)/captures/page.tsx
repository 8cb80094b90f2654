import Link from "next/link";
import { listCaptures } from "@/db/queries/captures";
import { listSites } from "@/db/queries/sites";
import { PageHeader } from "@/app/_components/page-header";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import { requirePage } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { captureStatusLabels, reviewStateLabels, verdictLabel, verdictLabels } from "@/lib/reports/format";
import { captureListQuerySchema } from "@/lib/validations/capture";

export const metadata = { title: "Captures" };

// The verdict filter's choices, in the words of the one verdict-label map (lib/reports/format.ts).
const verdictFilterLabels = Object.fromEntries((["pass", "fail", "incomplete"] as const).map((v) => [v, verdictLabels[v]]));

/** A filter's choice among `options` (value → label), or "Any". */
function AnyOfSelect({ name, label, value, options }: { name: string; label: string; value: string | undefined; options: Record<string, string> }) {
  return (
    <div>
      <label htmlFor={`f-${name}`} className="field-label">{label}</label>
      <select id={`f-${name}`} name={name} defaultValue={value ?? ""} className="field-input">
        <option value="">Any</option>
        {Object.entries(options).map(([v, l]) => <option key={v} value={v}>{l}</option>)}
      </select>
    </div>
  );
}

export default async function CapturesPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePage("captures:read");
  const raw = Object.fromEntries(Object.entries(await searchParams).filter(([, v]) => typeof v === "string" && v !== ""));
  const parsed = captureListQuerySchema.safeParse(raw);
  const query = parsed.success ? parsed.data : { page: 1 };
  const [{ items, total, page, pages }, sites] = await Promise.all([listCaptures({ query, reader: user }), listSites({ reader: user })]);
  const pageHref = (p: number) => `/captures?${new URLSearchParams({ ...(raw as Record<string, string>), page: String(p) })}`;

  return (
    <div className="space-y-4">
      <PageHeader title="Captures" add={can(user.role, "captures:upload") ? { href: "/captures/new", label: "New capture", testId: "new-capture" } : null} />
      {!parsed.success && <p className="text-sm text-fail">Some filters were not understood and were ignored.</p>}
      <form className="panel grid gap-3 sm:grid-cols-5 sm:items-end" method="get" data-testid="capture-filters">
        <div>
          <label htmlFor="f-site" className="field-label">Site</label>
          <select id="f-site" name="site" defaultValue={query.site ?? ""} className="field-input">
            <option value="">All sites</option>
            {sites.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
          </select>
        </div>
        <AnyOfSelect name="verdict" label="Verdict" value={query.verdict} options={verdictFilterLabels} />
        <AnyOfSelect name="status" label="Status" value={query.status} options={captureStatusLabels} />
        <div className="grid grid-cols-2 gap-2">
          <div>
            <label htmlFor="f-from" className="field-label">From</label>
            <input id="f-from" name="from" type="date" defaultValue={query.from ?? ""} className="field-input" />
          </div>
          <div>
            <label htmlFor="f-to" className="field-label">To</label>
            <input id="f-to" name="to" type="date" defaultValue={query.to ?? ""} className="field-input" />
          </div>
        </div>
        <div className="flex gap-2">
          <button type="submit" className="btn-quiet">Filter</button>
          <Link href="/captures" className="btn-quiet">Clear</Link>
        </div>
      </form>

      {items.length === 0 ? (
        <p className="panel text-sm text-ink-soft" data-testid="captures-empty">
          No captures match. {can(user.role, "captures:upload") ? "Register one with “New capture”." : ""}
        </p>
      ) : (
        <div className="panel p-0 sm:overflow-x-auto sm:p-0">
          {/* On a phone each capture is a card (the table stacks), so the verdict and review never sit off-screen. */}
          <table className="table-base table-stack" data-testid="capture-table">
            <thead>
              <tr><th>Capture</th><th>Site</th><th>Status</th><th>Verdict</th><th>Review</th><th>Registered</th></tr>
            </thead>
            <tbody>
              {items.map((c) => (
                <tr key={c.id}>
                  <td><Link href={`/captures/${c.id}`} className="font-medium hover:text-copper">{c.title}</Link></td>
                  <td className="text-ink-soft" data-label="Site">{c.siteName}</td>
                  <td data-label="Status">{captureStatusLabels[c.status] ?? c.status}</td>
                  <td data-label="Verdict">
                    {/* The team sees the latest verdict; a viewer only ever the approved one. */}
                    {(() => {
                      const shown = user.role === "viewer" ? c.verdict : (c.latestVerdict ?? c.verdict);
                      return shown ? <VerdictBadge verdict={shown} testId="capture-verdict" /> : "—";
                    })()}
                    {user.role !== "viewer" && c.approvedVerdict && c.approvedVerdict !== (c.latestVerdict ?? c.verdict) && (
                      <span className="mt-1 block text-xs text-ink-soft" data-testid="approved-verdict">
                        approved as {verdictLabel(c.approvedVerdict)}; latest differs
                      </span>
                    )}
                  </td>
                  <td data-testid="capture-review" data-label="Review">
                    {c.approved ? "Approved" : (reviewStateLabels[c.reviewState] ?? c.reviewState)}
                    {c.newerAwaitsReview && user.role !== "viewer" && (
                      <span className="block text-xs text-caution" data-testid="newer-awaits">A newer result awaits review</span>
                    )}
                  </td>
                  <td className="text-ink-soft sm:whitespace-nowrap" data-label="Registered">
                    {c.createdAt.toISOString().slice(0, 10)}
                    {c.uploadedByName ? ` · ${c.uploadedByName}` : ""}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <nav className="flex items-center justify-between text-sm" aria-label="Pages">
        <span className="text-ink-muted">{total} capture{total === 1 ? "" : "s"} · page {page} of {pages}</span>
        <span className="flex gap-2">
          {page > 1 && <Link className="btn-quiet py-1" href={pageHref(page - 1)}>Previous</Link>}
          {page < pages && <Link className="btn-quiet py-1" href={pageHref(page + 1)}>Next</Link>}
        </span>
      </nav>
    </div>
  );
}
