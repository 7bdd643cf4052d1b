import type { Metadata } from 'next';
import Link from 'next/link';
import { ActivityList } from '@/components/activity/activity-list';
import { listShopActivity } from '@/db/queries/audit';
import { pageMember } from '@/server/page-context';
import { ShopMembers } from './_components/shop-members';
import { ShopSettingsForm } from './_components/shop-settings-form';
import { RetentionForm } from './_components/retention-form';
import { ShopData } from './_components/shop-data';
import { getRetention, lastRetentionSweep } from '@/db/queries/retention';
import { formatWhen } from '@/domain/time';

export const metadata: Metadata = { title: 'Shop' };

export default async function ShopPage() {
  const m = await pageMember('/shop');
  const isOwner = m.member.role === 'owner';
  const [activity, retention, lastSweep] = isOwner ? await Promise.all([listShopActivity(m.shop.id, 100), getRetention(m.shop.id), lastRetentionSweep()]) : [[], null, null];
  return (
    <div className="flex max-w-4xl flex-col gap-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h1 className="text-2xl font-bold">{m.shop.name}</h1>
        {isOwner && (
          <Link className="font-bold text-brand underline" href="/shop/api">
            API reference for integrations
          </Link>
        )}
      </div>
      {isOwner && (
        <section aria-labelledby="shop-settings" className="rounded-2xl border border-line bg-surface p-5">
          <h2 id="shop-settings" className="text-lg font-bold">
            Dates and units
          </h2>
          <ShopSettingsForm settings={m.shop.settings} />
        </section>
      )}
      {isOwner && (
        <section aria-labelledby="shop-retention" className="rounded-2xl border border-line bg-surface p-5">
          <h2 id="shop-retention" className="text-lg font-bold">
            Data retention
          </h2>
          <RetentionForm days={retention} lastSweep={lastSweep ? formatWhen(lastSweep, m.shop.settings.timeZone) : null} />
        </section>
      )}
      <ShopMembers isOwner={isOwner} selfMemberId={m.member.id} />
      {isOwner && (
        <section aria-labelledby="shop-data" className="rounded-2xl border border-line bg-surface p-5">
          <h2 id="shop-data" className="text-lg font-bold">
            The shop’s data
          </h2>
          <ShopData name={m.shop.name} />
        </section>
      )}
      {isOwner && (
        <section aria-labelledby="shop-activity" className="rounded-2xl border border-line bg-surface p-5">
          <h2 id="shop-activity" className="text-lg font-bold">
            Activity in this shop
          </h2>
          <p className="text-sm text-muted">The last 100 sign-ins, uploads, saves, reports sent and changes to members, newest first.</p>
          <ActivityList items={activity} timeZone={m.shop.settings.timeZone} />
        </section>
      )}
    </div>
  );
}
