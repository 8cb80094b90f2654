import Link from "next/link";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import { listCaptures } from "@/db/queries/captures";
import { getSiteById } from "@/db/queries/sites";
import { orNotFound, requirePage, uuidOr404 } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { SiteForm } from "../_components/site-form";

export default async function SitePage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePage("sites:read");
  const { id } = await params;
  uuidOr404(id);
  const site = await orNotFound(getSiteById({ id, reader: user }));
  const ratio = site.iscA && site.ilA ? site.iscA / site.ilA : null;
  const captures = await listCaptures({ query: { site: site.id, page: 1 }, reader: user });
  return (
    <div className="max-w-2xl space-y-4">
      <h1 data-testid="site-title">{site.name}</h1>
      <p className="text-sm text-ink-soft">
        {site.nominalVoltageV.toLocaleString("en-GB")} V · {site.frequencyHz} Hz
        {ratio != null && <> · Isc/IL = {ratio.toFixed(1)}</>}
      </p>
      {site.notes && <p className="text-sm">{site.notes}</p>}
      <section className="panel space-y-2" data-testid="site-captures">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h2>Captures at this site</h2>
          <span className="flex gap-2">
            {can(user.role, "captures:upload") && (
              <Link href={`/captures/new?site=${site.id}`} className="btn-primary py-1">New capture here</Link>
            )}
            <Link href={`/captures?site=${site.id}`} className="btn-quiet py-1">All of them</Link>
          </span>
        </div>
        {captures.items.length === 0 ? (
          <p className="text-sm text-ink-soft">None yet.</p>
        ) : (
          <ul className="divide-y divide-line text-sm">
            {captures.items.slice(0, 8).map((c) => (
              <li key={c.id} className="flex flex-wrap items-baseline justify-between gap-2 py-1.5">
                <Link href={`/captures/${c.id}`} className="font-medium hover:text-copper">{c.title}</Link>
                <span className="flex items-center gap-2 text-ink-muted">
                  {/* As the captures list shows it: the team the latest verdict, a viewer the approved one. */}
                  {(() => {
                    const shown = user.role === "viewer" ? c.verdict : (c.latestVerdict ?? c.verdict);
                    return shown ? <VerdictBadge verdict={shown} /> : <span>not analysed yet</span>;
                  })()}
                  {c.createdAt.toISOString().slice(0, 10)}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
      {can(user.role, "sites:write") && (
        <>
          <h2>Edit</h2>
          <SiteForm site={site} />
        </>
      )}
    </div>
  );
}
