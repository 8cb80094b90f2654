import Link from "next/link";
import { listCaptures } from "@/db/queries/captures";
import { listSites } from "@/db/queries/sites";
import { PageHeader } from "@/app/_components/page-header";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import { requirePage } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { IsoDateInput } from "@/app/_components/iso-date-input";
import { captureStatusLabels, reviewStateLabels, verdictLabel, verdictLabels } from "@/lib/reports/format";
import { captureListQuerySchema, type CaptureListQuery } from "@/lib/validations/capture";

export const metadata = { title: "Captures" };

// The verdict filter's choices, in the words of the one verdict-label map (lib/reports/format.ts).
const verdictFilterLabels = Object.fromEntries((["pass", "fail", "incomplete"] as const).map((v) => [v, verdictLabels[v]]));

const filterLabels: Record<string, string> = { site: "Site", verdict: "Verdict", status: "Status", from: "Registered from", to: "Registered to", page: "Page" };

/** The list's filters from the address; a filter that does not parse is named with its problem and left out, the others kept. */
function readFilters(raw: Record<string, string>): { query: CaptureListQuery; problems: Array<{ key: string; label: string; value: string; message: string }> } {
  const parsed = captureListQuerySchema.safeParse(raw);
  if (parsed.success) return { query: parsed.data, problems: [] };
  const problems = new Map<string, { key: string; label: string; value: string; message: string }>();
  for (const issue of parsed.error.issues) {
    const key = String(issue.path[0] ?? "");
    if (!problems.has(key)) problems.set(key, { key, label: filterLabels[key] ?? key, value: raw[key] ?? "", message: issue.message });
  }
  const rest = captureListQuerySchema.safeParse(Object.fromEntries(Object.entries(raw).filter(([key]) => !problems.has(key))));
  return { query: rest.success ? rest.data : { page: 1 }, problems: [...problems.values()] };
}

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
  const raw = Object.fromEntries(Object.entries(await searchParams).filter((e): e is [string, string] => typeof e[1] === "string" && e[1] !== ""));
  const { query, problems } = readFilters(raw);
  const [{ items, total, page, pages }, sites] = await Promise.all([listCaptures({ query, reader: user }), listSites({ reader: user })]);
  const pageHref = (p: number) => `/captures?${new URLSearchParams({ ...(raw as Record<string, string>), page: String(p) })}`;

  return (
    <div className="space-y-4">
      <PageHeader title="Captures" add={can(user.role, "captures:upload") ? { href: "/captures/new", label: "New capture", testId: "new-capture" } : null} />
      {problems.length > 0 && (
        <ul className="text-sm text-fail" role="alert" data-testid="filter-problems">
          {problems.map((p) => <li key={p.key}>{p.label}: “{p.value}” — {p.message}. This filter was ignored.</li>)}
        </ul>
      )}
      <form className="panel grid gap-3 sm:grid-cols-3 sm:items-end lg:grid-cols-6" method="get" data-testid="capture-filters">
        <div>
          <label htmlFor="f-site" className="field-label">Site</label>
          <select id="f-site" name="site" defaultValue={query.site ?? ""} className="field-input">
            <option value="">All sites</option>
            {sites.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
          </select>
        </div>
        <AnyOfSelect name="verdict" label="Verdict" value={query.verdict} options={verdictFilterLabels} />
        <AnyOfSelect name="status" label="Status" value={query.status} options={captureStatusLabels} />
        <fieldset className="min-w-0 sm:col-span-2">
          <legend className="sr-only">Registered between</legend>
          <div className="grid grid-cols-2 gap-2">
            <IsoDateInput id="f-from" name="from" label="From" defaultValue={raw.from} error={problems.find((p) => p.key === "from")?.message} />
            <IsoDateInput id="f-to" name="to" label="To" defaultValue={raw.to} error={problems.find((p) => p.key === "to")?.message} />
          </div>
        </fieldset>
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
