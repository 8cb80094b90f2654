import Link from "next/link";

export default function Forbidden() {
  return (
    <main className="mx-auto max-w-md px-4 py-16 text-center" data-testid="forbidden">
      <h1>Not available to your role</h1>
      <p className="mt-2 text-sm text-ink-soft">Ask an admin if you need access to this page.</p>
      <Link href="/" className="btn-quiet mt-6">Back to Ordwise</Link>
    </main>
  );
}
