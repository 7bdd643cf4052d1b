/** Engine profiles: the built-in library (TRADE.md firing orders) and the shop's own; owners add their own. */
import { recordAudit } from '@/db/queries/audit';
import { createProfile, listProfiles } from '@/db/queries/profiles';
import { engineSpec } from '@/domain/engine';
import { withShop } from '@/server/with-shop';
import { ENGINE_PROFILES, profileEngine } from '@/signal';
import * as api from '@/server/api/routes/catalog';

export const GET = withShop(api.listProfiles, async ({ shop }) => ({
  builtIn: ENGINE_PROFILES.map((p) => ({ key: p.key, label: p.label, engine: profileEngine(p) })),
  shop: await listProfiles(shop.id),
}));

export const POST = withShop(
  api.addProfile, async ({ input, shop, user }) => {
    const profile = await createProfile(shop.id, input.label, engineSpec(input.engine));
    await recordAudit(shop.id, user.id, 'profile.create', { type: 'profile', id: profile.id });
    return { profile };
  },
);
