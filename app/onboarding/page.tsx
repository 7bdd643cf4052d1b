import { redirect } from 'next/navigation';
import { Wordmark } from '@/components/brand/logo';
import { pageSession } from '@/server/page-context';
import { CreateShopForm } from './create-shop-form';

export const dynamic = 'force-dynamic';

export default async function OnboardingPage() {
  const s = await pageSession();
  if (!s) redirect('/sign-in?next=/onboarding');
  return (
    <main className="mx-auto flex min-h-screen max-w-xl flex-col gap-6 px-4 py-10">
      <Wordmark />
      <h1 className="text-2xl font-bold">Welcome, {s.user.name}</h1>
      <p>
        If your shop already uses Crankprint, open the invitation link your shop owner sent you. Otherwise, set up
        your shop here; you will be its owner.
      </p>
      <CreateShopForm />
    </main>
  );
}
