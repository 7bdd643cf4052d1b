/**
 * Every shop keeps an owner, even when two owners demote (or remove) each other at the same moment: the check and
 * the change run in one transaction over the shop's locked member rows. 100 races on the embedded database and,
 * in the PostgreSQL pass, on a server where the two requests really run at once.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { and, eq, inArray, notInArray } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';

process.env.CRANKPRINT_DATA_DIR = mkdtempSync(join(tmpdir(), 'crankprint-owner-'));
process.env.CRANKPRINT_DEMO = '1';

const { getDb } = await import('@/db/client');
const schema = await import('@/db/schema');
const { changeMember } = await import('@/db/queries/shops');

let shopId = '';
let a = '';
let b = '';

beforeAll(async () => {
  const db = await getDb();
  const rows = await db.select().from(schema.members).limit(2);
  shopId = rows[0].organizationId;
  const two = (await db.select().from(schema.members).where(eq(schema.members.organizationId, shopId))).slice(0, 2);
  [a, b] = two.map((m) => m.id);
}, 60_000);

async function owners(): Promise<number> {
  const db = await getDb();
  return (await db.select().from(schema.members).where(and(eq(schema.members.organizationId, shopId), eq(schema.members.role, 'owner')))).length;
}

describe('the last owner', () => {
  it('two owners demoting each other at once: one wins, one is refused, 100 times', async () => {
    const db = await getDb();
    let failures = 0;
    for (let i = 0; i < 100; i++) {
      await db.update(schema.members).set({ role: 'owner' }).where(inArray(schema.members.id, [a, b]));
      await db.update(schema.members).set({ role: 'technician' }).where(and(eq(schema.members.organizationId, shopId), notInArray(schema.members.id, [a, b])));
      const [x, y] = await Promise.all([changeMember(shopId, a, { role: 'technician' }), changeMember(shopId, b, { role: 'advisor' })]);
      const refused = [x, y].filter((r) => r?.lastOwner).length;
      if ((await owners()) !== 1 || refused !== 1) failures++;
    }
    expect(failures).toBe(0);
  });

  it('removing the one owner is refused and changes nothing', async () => {
    const db = await getDb();
    await db.update(schema.members).set({ role: 'technician' }).where(and(eq(schema.members.organizationId, shopId), notInArray(schema.members.id, [a])));
    await db.update(schema.members).set({ role: 'owner' }).where(eq(schema.members.id, a));
    expect((await changeMember(shopId, a, 'remove'))?.lastOwner).toBe(true);
    expect(await owners()).toBe(1);
  });
});
