'use client';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import { authClient } from '@/components/data/auth-client';

export default function ForgotPasswordPage() {
  const [email, setEmail] = useState('');
  const [sent, setSent] = useState(false);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    await authClient.requestPasswordReset({ email, redirectTo: '/reset-password' });
    setBusy(false);
    // The same answer whether or not the address has an account.
    setSent(true);
  }

  return (
    <form onSubmit={submit} className="flex w-full max-w-md flex-col gap-2 rounded-2xl border border-line bg-surface p-6">
      <h1 className="mb-2 text-2xl font-bold">Reset your password</h1>
      {sent ? (
        <Notice tone="ok">If {email} has an account, a reset link is on its way. It works for one hour.</Notice>
      ) : (
        <>
          <Field id="email" label="E-mail">
            <Input id="email" type="email" autoComplete="email" value={email} onChange={(e) => setEmail(e.target.value)} required />
          </Field>
          <Button type="submit" disabled={busy || !email}>
            Send the reset link
          </Button>
        </>
      )}
    </form>
  );
}
