import { Wordmark } from '@/components/brand/logo';

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="mx-auto flex min-h-screen max-w-5xl flex-col gap-8 px-4 py-10">
      <Wordmark />
      <div className="flex flex-1 flex-col gap-8 md:flex-row md:items-start">{children}</div>
    </main>
  );
}
