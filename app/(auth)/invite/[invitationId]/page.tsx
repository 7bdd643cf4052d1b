'use client';
import Link from 'next/link';
import { useParams, useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/field';
import { authClient } from '@/components/data/auth-client';

export default function InvitePage() {
  const { invitationId } = useParams<{ invitationId: string }>();
  const router = useRouter();
  const session = authClient.useSession();
  const [error, setError] = useState<string | null>(null);
  const here = `/invite/${invitationId}`;

  async function accept() {
    setError(null);
    const { data, error } = await authClient.organization.acceptInvitation({ invitationId });
    if (error) return setError('This invitation has expired, was cancelled, or is for another e-mail address. Ask your shop owner to send a new one.');
    await authClient.organization.setActive({ organizationId: data.member.organizationId });
    router.push('/jobs');
    router.refresh();
  }

  return (
    <div className="flex w-full max-w-md flex-col gap-3 rounded-2xl border border-line bg-surface p-6">
      <h1 className="text-2xl font-bold">You are invited to a shop</h1>
      {error && <Notice tone="error">{error}</Notice>}
      {session.isPending ? null : session.data ? (
        <>
          <p>
            Signed in as <strong>{session.data.user.email}</strong>.
          </p>
          <Button onClick={accept}>Accept the invitation</Button>
        </>
      ) : (
        <>
          <p>Sign in, or create an account with the address the invitation was sent to, then come back to this link.</p>
          <Link className="font-bold text-brand underline" href={`/sign-in?next=${encodeURIComponent(here)}`}>
            Sign in
          </Link>
          <Link className="font-bold text-brand underline" href="/sign-up">
            Create an account
          </Link>
        </>
      )}
    </div>
  );
}
