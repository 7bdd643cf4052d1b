/** While a signed-in page loads on the server. */
export default function Loading() {
  return (
    <main className="mx-auto max-w-5xl px-4 py-8" aria-busy="true">
      <p className="text-muted">Loading…</p>
    </main>
  );
}
