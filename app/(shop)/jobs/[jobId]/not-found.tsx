import Link from 'next/link';

export default function JobNotFound() {
  return (
    <div className="rounded-2xl border border-line bg-surface p-6">
      <h1 className="text-xl font-bold">That job is not in your shop</h1>
      <p className="mt-2">
        Check the repair order and try again from the <Link className="font-bold text-brand underline" href="/jobs">jobs list</Link>.
      </p>
    </div>
  );
}
