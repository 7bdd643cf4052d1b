import type { Metadata } from 'next';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '@/db/seed';
import { SignInForm } from './_components/sign-in-form';

export const metadata: Metadata = { title: 'Sign in' };
export const dynamic = 'force-dynamic';

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string; verified?: string }> }) {
  const { next } = await searchParams;
  const demo = process.env.CRANKPRINT_DEMO === '1' ? DEMO_ACCOUNTS.map((a) => ({ ...a, password: DEMO_PASSWORD })) : [];
  return <SignInForm next={next && next.startsWith('/') && !next.startsWith('//') ? next : '/jobs'} demo={demo} />;
}
