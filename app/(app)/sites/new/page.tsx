import { requirePage } from "@/lib/auth/page";
import { SiteForm } from "../_components/site-form";

export const metadata = { title: "New site" };

export default async function NewSitePage() {
  await requirePage("sites:create");
  return (
    <div className="max-w-2xl space-y-4">
      <h1>New site</h1>
      <SiteForm />
    </div>
  );
}
