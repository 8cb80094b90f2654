import { requirePage } from "@/lib/auth/page";

export const metadata = { title: "Captures" };

export default async function CapturesPage() {
  await requirePage("captures:read");
  return (
    <div className="space-y-4">
      <h1>Captures</h1>
      <p className="panel text-sm text-ink-soft" data-testid="captures-empty">
        No captures yet. Captures are registered against a site and analysed once uploaded.
      </p>
    </div>
  );
}
