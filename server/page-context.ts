/**
 * The same session and shop checks for server-rendered pages: a signed-out visitor goes to sign-in, a user
 * without a shop to onboarding. Pages then read through the data-access layer with the shop id.
 */
import 'server-only';
import { headers } from 'next/headers';
import { redirect } from 'next/navigation';
import type { ShopSettings } from '@/domain/shop-settings';
import { HttpError } from './http';
import { can, type Permission, type RoleName } from './permissions';
import { requireSession, resolveMembership, type SessionContext } from './with-shop';

export interface PageMember extends SessionContext {
  shop: { id: string; name: string; settings: ShopSettings };
  member: { id: string; role: RoleName };
  can: (p: Permission) => boolean;
}

export async function pageSession(): Promise<SessionContext | null> {
  try {
    return await requireSession({ headers: await headers() });
  } catch (e) {
    if (e instanceof HttpError && e.status === 401) return null;
    throw e;
  }
}

export async function pageMember(path = '/jobs'): Promise<PageMember> {
  const s = await pageSession();
  if (!s) redirect(`/sign-in?next=${encodeURIComponent(path)}`);
  let m;
  try {
    m = await resolveMembership(s);
  } catch (e) {
    if (e instanceof HttpError && e.status === 403) redirect('/onboarding');
    throw e;
  }
  const role = m.role as RoleName;
  return { ...s, shop: { id: m.shopId, name: m.shopName, settings: m.settings }, member: { id: m.memberId, role }, can: (p) => can(role, p) };
}
