import type { Metadata } from 'next';
import { pageMember } from '@/server/page-context';
import { ShopMembers } from './_components/shop-members';

export const metadata: Metadata = { title: 'Shop' };

export default async function ShopPage() {
  const m = await pageMember('/shop');
  return (
    <div className="flex max-w-4xl flex-col gap-4">
      <h1 className="text-2xl font-bold">{m.shop.name}</h1>
      <ShopMembers isOwner={m.member.role === 'owner'} selfMemberId={m.member.id} />
    </div>
  );
}
