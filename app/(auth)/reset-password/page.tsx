'use client';
import Link from 'next/link';
import { useSearchParams } from 'next/navigation';
import { Suspense, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import { authClient } from '@/components/data/auth-client';

function ResetForm() {
  const token = useSearchParams().get('token');
  const [password, setPassword] = useState('');
  const [confirm, setConfirm] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (password.length < 10) return setError('Use at least 10 characters.');
    if (password !== confirm) return setError('The two passwords differ.');
    const { error } = await authClient.resetPassword({ newPassword: password, token: token ?? '' });
    if (error) return setError('This reset link has expired or was already used; ask for a new one.');
    setDone(true);
  }

  if (!token) return <Notice tone="error">This page needs the link from the reset e-mail.</Notice>;
  return (
    <form onSubmit={submit} className="flex w-full max-w-md flex-col gap-2 rounded-2xl border border-line bg-surface p-6">
      <h1 className="mb-2 text-2xl font-bold">Choose a new password</h1>
      {done ? (
        <Notice tone="ok">
          Your password is changed. <Link href="/sign-in" className="underline">Sign in</Link>
        </Notice>
      ) : (
        <>
          {error && <Notice tone="error">{error}</Notice>}
          <Field id="password" label="New password" hint="At least 10 characters.">
            <Input id="password" type="password" autoComplete="new-password" value={password} onChange={(e) => setPassword(e.target.value)} />
          </Field>
          <Field id="confirm" label="New password again">
            <Input id="confirm" type="password" autoComplete="new-password" value={confirm} onChange={(e) => setConfirm(e.target.value)} />
          </Field>
          <Button type="submit">Save the new password</Button>
        </>
      )}
    </form>
  );
}

export default function ResetPasswordPage() {
  return (
    <Suspense>
      <ResetForm />
    </Suspense>
  );
}
