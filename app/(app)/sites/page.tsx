import Link from "next/link";
import { listSites } from "@/db/queries/sites";
import { PageHeader } from "@/app/_components/page-header";
import { requirePage } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";

export const metadata = { title: "Sites" };

function fmt(n: number | null, unit: string) {
  return n == null ? "—" : `${n.toLocaleString("en-GB")} ${unit}`;
}

export default async function SitesPage() {
  const user = await requirePage("sites:read");
  const sites = await listSites({ reader: user });
  return (
    <div className="space-y-4">
      <PageHeader title="Sites" add={can(user.role, "sites:create") ? { href: "/sites/new", label: "New site", testId: "new-site" } : null} />
      {sites.length === 0 ? (
        <p className="panel text-sm text-ink-soft">No sites yet.</p>
      ) : (
        <ul className="grid gap-3 md:grid-cols-2" data-testid="site-list">
          {sites.map((s) => (
            <li key={s.id} className="panel">
              <Link href={`/sites/${s.id}`} className="font-medium text-ink hover:text-copper">
                {s.name}
              </Link>
              <p className="text-sm text-ink-muted">{s.address || "No address"}</p>
              <dl className="mt-2 grid grid-cols-2 gap-x-4 text-sm sm:grid-cols-4">
                <div><dt className="text-2xs uppercase text-ink-muted">Voltage</dt><dd>{fmt(s.nominalVoltageV, "V")}</dd></div>
                <div><dt className="text-2xs uppercase text-ink-muted">Frequency</dt><dd>{s.frequencyHz} Hz</dd></div>
                <div><dt className="text-2xs uppercase text-ink-muted">Isc</dt><dd>{fmt(s.iscA, "A")}</dd></div>
                <div><dt className="text-2xs uppercase text-ink-muted">IL</dt><dd>{fmt(s.ilA, "A")}</dd></div>
              </dl>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
