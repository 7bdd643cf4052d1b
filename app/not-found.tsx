import Link from 'next/link';

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl px-4 py-16">
      <h1 className="text-2xl font-bold">Not found</h1>
      <p className="mt-2">
        That page does not exist, or it belongs to another shop. Go back to the <Link className="font-bold text-brand underline" href="/jobs">jobs list</Link>.
      </p>
    </main>
  );
}
