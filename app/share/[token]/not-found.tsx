export default function SharedLinkGone() {
  return (
    <main className="mx-auto max-w-md px-4 py-16 text-center" data-testid="share-invalid">
      <h1>This link is no longer valid</h1>
      <p className="mt-2 text-sm text-ink-soft">
        It may have expired or been revoked by the engineer who shared it. Ask them for a new link.
      </p>
    </main>
  );
}
