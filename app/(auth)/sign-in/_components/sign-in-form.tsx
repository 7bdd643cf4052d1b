'use client';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import { authClient } from '@/components/data/auth-client';

interface DemoAccount {
  role: string;
  name: string;
  email: string;
  password: string;
}

export function SignInForm({ next, demo }: { next: string; demo: DemoAccount[] }) {
  const router = useRouter();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    const { error } = await authClient.signIn.email({ email, password });
    setBusy(false);
    if (error) {
      setError(
        error.status === 403
          ? 'Confirm your e-mail address first: open the link we sent you.'
          : error.status === 429
            ? 'Too many attempts; wait a minute and try again.'
            : 'The e-mail address or password is wrong.',
      );
      return;
    }
    router.push(next);
    router.refresh();
  }

  return (
    <>
      <form onSubmit={submit} className="flex w-full max-w-md flex-col gap-2 rounded-2xl border border-line bg-surface p-6" noValidate>
        <h1 className="mb-2 text-2xl font-bold">Sign in</h1>
        {error && <Notice tone="error">{error}</Notice>}
        <Field id="email" label="E-mail">
          <Input id="email" type="email" autoComplete="username" value={email} onChange={(e) => setEmail(e.target.value)} required />
        </Field>
        <Field id="password" label="Password">
          <Input id="password" type="password" autoComplete="current-password" value={password} onChange={(e) => setPassword(e.target.value)} required />
        </Field>
        <Button type="submit" disabled={busy}>
          {busy ? 'Signing in…' : 'Sign in'}
        </Button>
        <div className="mt-3 flex flex-wrap justify-between gap-2 text-sm">
          <Link className="min-h-touch content-center font-bold text-brand underline" href="/sign-up">
            New here? Create an account
          </Link>
          <Link className="min-h-touch content-center font-bold text-brand underline" href="/forgot-password">
            Forgot your password?
          </Link>
        </div>
      </form>
      {demo.length > 0 && (
        <section aria-labelledby="demo-title" className="w-full max-w-sm rounded-2xl border-2 border-dashed border-brand bg-raised p-5">
          <h2 id="demo-title" className="text-lg font-bold">
            Demo accounts
          </h2>
          <p className="mb-3 text-sm text-muted">An invented shop for trying Crankprint. One tap fills the form.</p>
          <ul className="flex flex-col gap-2">
            {demo.map((a) => (
              <li key={a.email}>
                <button
                  type="button"
                  className="min-h-touch w-full rounded-lg border border-line bg-surface px-3 py-2 text-left hover:border-brand"
                  onClick={() => {
                    setEmail(a.email);
                    setPassword(a.password);
                  }}
                >
                  <span className="block font-bold capitalize">{a.role}</span>
                  <span className="figures block text-sm text-muted">{a.email}</span>
                </button>
              </li>
            ))}
          </ul>
          <p className="figures mt-3 text-sm">
            Password: <strong>{demo[0].password}</strong>
          </p>
        </section>
      )}
    </>
  );
}
