'use client';
import { zodResolver } from '@hookform/resolvers/zod';
import Link from 'next/link';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import { authClient } from '@/components/data/auth-client';

const schema = z
  .object({
    name: z.string().trim().min(2, 'Enter your name as colleagues know it.').max(80),
    email: z.string().trim().email('Enter an e-mail address such as name@example.com.'),
    password: z.string().min(10, 'Use at least 10 characters.').max(128, 'Use at most 128 characters.'),
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ.' });

type Values = z.infer<typeof schema>;

export function SignUpForm() {
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(schema) });
  const errors = formState.errors;

  async function submit(v: Values) {
    setError(null);
    const { error } = await authClient.signUp.email({ name: v.name, email: v.email, password: v.password, callbackURL: '/onboarding' });
    if (error) {
      setError(error.status === 422 || /exist/i.test(error.message ?? '') ? 'An account with that e-mail already exists; sign in instead.' : (error.message ?? 'Sign-up failed; try again.'));
      return;
    }
    setSentTo(v.email);
  }

  if (sentTo) {
    return (
      <div className="w-full max-w-md rounded-2xl border border-line bg-surface p-6">
        <h1 className="mb-2 text-2xl font-bold">Check your e-mail</h1>
        <p>
          We sent a confirmation link to <strong>{sentTo}</strong>. Open it to finish creating your account.
        </p>
      </div>
    );
  }

  return (
    <form onSubmit={handleSubmit(submit)} className="flex w-full max-w-md flex-col gap-2 rounded-2xl border border-line bg-surface p-6" noValidate>
      <h1 className="mb-2 text-2xl font-bold">Create an account</h1>
      {error && <Notice tone="error">{error}</Notice>}
      <Field id="name" label="Your name" error={errors.name?.message}>
        <Input id="name" autoComplete="name" invalid={!!errors.name} {...register('name')} />
      </Field>
      <Field id="email" label="E-mail" error={errors.email?.message}>
        <Input id="email" type="email" autoComplete="email" invalid={!!errors.email} {...register('email')} />
      </Field>
      <Field id="password" label="Password" hint="At least 10 characters." error={errors.password?.message}>
        <Input id="password" type="password" autoComplete="new-password" invalid={!!errors.password} {...register('password')} />
      </Field>
      <Field id="confirm" label="Password again" error={errors.confirm?.message}>
        <Input id="confirm" type="password" autoComplete="new-password" invalid={!!errors.confirm} {...register('confirm')} />
      </Field>
      <Button type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? 'Creating…' : 'Create account'}
      </Button>
      <Link className="mt-3 min-h-touch content-center text-sm font-bold text-brand underline" href="/sign-in">
        Already have an account? Sign in
      </Link>
    </form>
  );
}
