import { Wordmark } from '@/components/brand/logo';
import { ShopSettingsProvider } from '@/components/shop/shop-settings-context';
import { pageMember } from '@/server/page-context';
import { NavLinks } from './_components/nav-links';
import { UserMenu } from './_components/user-menu';

export const dynamic = 'force-dynamic';

export default async function ShopLayout({ children }: { children: React.ReactNode }) {
  const m = await pageMember();
  return (
    <div className="min-h-screen">
      <header className="border-b border-line bg-surface">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-4 px-4 py-2">
          <Wordmark />
          <span className="rounded-md bg-raised px-2 py-1 text-sm font-bold" title="Your shop">
            {m.shop.name}
          </span>
          <NavLinks canManage={m.member.role === 'owner'} />
          <UserMenu name={m.user.name} role={m.member.role} />
        </div>
      </header>
      <main className="mx-auto max-w-7xl px-4 py-6">
        <ShopSettingsProvider settings={m.shop.settings}>{children}</ShopSettingsProvider>
      </main>
    </div>
  );
}
