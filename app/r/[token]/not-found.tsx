export default function LinkNotFound() {
  return (
    <main className="mx-auto max-w-xl px-4 py-16 text-lg">
      <h1 className="text-2xl font-bold">This link does not open a report</h1>
      <p className="mt-2">It may have expired or been withdrawn. Ask the shop that sent it for a new one.</p>
    </main>
  );
}
