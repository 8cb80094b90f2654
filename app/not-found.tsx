import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-md px-4 py-16 text-center">
      <h1>Nothing here</h1>
      <p className="mt-2 text-sm text-ink-soft">The page or record does not exist, or it was removed.</p>
      <Link href="/" className="btn-quiet mt-6">Back to Ordwise</Link>
    </main>
  );
}
