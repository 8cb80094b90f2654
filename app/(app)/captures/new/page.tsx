import { listSites } from "@/db/queries/sites";
import { requirePage } from "@/lib/auth/page";
import { maxUploadBytes } from "@/lib/validations/capture";
import { UploadForm } from "./upload-form";

export const metadata = { title: "New capture" };

export default async function NewCapturePage({ searchParams }: { searchParams: Promise<{ site?: string }> }) {
  const user = await requirePage("captures:upload");
  const [sites, { site }] = await Promise.all([listSites({ reader: user }), searchParams]);
  return (
    <div className="max-w-2xl space-y-4">
      <h1>New capture</h1>
      <UploadForm sites={sites.map((s) => ({ id: s.id, name: s.name }))} defaultSiteId={site} maxBytes={maxUploadBytes} />
    </div>
  );
}
