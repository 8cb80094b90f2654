import { notFound } from "next/navigation";
import { z } from "zod";
import { getSiteById } from "@/db/queries/sites";
import { requirePage } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { SiteForm } from "../_components/site-form";

export default async function SitePage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePage("sites:read");
  const { id } = await params;
  if (!z.uuid().safeParse(id).success) notFound();
  const site = await getSiteById({ id }).catch((err) => {
    if (err instanceof AppError && err.code === "not_found") notFound();
    throw err;
  });
  const ratio = site.iscA && site.ilA ? site.iscA / site.ilA : null;
  return (
    <div className="max-w-2xl space-y-4">
      <h1 data-testid="site-title">{site.name}</h1>
      <p className="text-sm text-ink-soft">
        {site.nominalVoltageV.toLocaleString("en-GB")} V · {site.frequencyHz} Hz
        {ratio != null && <> · Isc/IL = {ratio.toFixed(1)}</>}
      </p>
      {site.notes && <p className="text-sm">{site.notes}</p>}
      {can(user.role, "sites:write") && (
        <>
          <h2>Edit</h2>
          <SiteForm site={site} />
        </>
      )}
    </div>
  );
}
