'use client';
import { useRouter } from 'next/navigation';
import { authClient } from '@/components/data/auth-client';
import { ThemeToggle } from '@/components/ui/theme-toggle';

export function UserMenu({ name, role }: { name: string; role: string }) {
  const router = useRouter();
  return (
    <div className="flex items-center gap-2">
      <ThemeToggle />
      <span className="text-sm">
        <span className="font-bold">{name}</span> <span className="text-muted">· {role}</span>
      </span>
      <button
        type="button"
        className="min-h-touch rounded-lg px-3 font-bold hover:bg-raised"
        onClick={async () => {
          await authClient.signOut();
          router.push('/sign-in');
          router.refresh();
        }}
      >
        Sign out
      </button>
    </div>
  );
}
