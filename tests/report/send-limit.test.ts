/**
 * The report e-mail limit cannot be passed by sending at once: 30 concurrent reservations by one member against a
 * budget of 10 an hour give exactly 10, and a given-back reservation frees its place. On the embedded database
 * and, in the PostgreSQL pass, on a server where the requests really run concurrently.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';

process.env.CRANKPRINT_DATA_DIR = mkdtempSync(join(tmpdir(), 'crankprint-send-limit-'));
process.env.CRANKPRINT_DEMO = '1';

const { getDb } = await import('@/db/client');
const schema = await import('@/db/schema');
const audit = await import('@/db/queries/audit');

let shopId = '';
let userId = '';
const limits = { perMember: 10, perShop: 40, sinceMs: 3_600_000 };
const subject = { type: 'report', id: 'limit-test' };

beforeAll(async () => {
  const db = await getDb();
  const [job] = await db.select().from(schema.jobs).limit(1);
  const [user] = await db.select().from(schema.users).limit(1);
  shopId = job.shopId;
  userId = user.id;
}, 60_000);

describe('report e-mails are reserved atomically', () => {
  it('30 at once against 10 an hour: 10 pass, 20 are refused as the member’s budget', async () => {
    const action = `report.send.test-${Date.now()}`;
    const results = await Promise.all(Array.from({ length: 30 }, () => audit.reserveAction(shopId, userId, action, limits, subject, {})));
    expect(results.filter((r) => 'id' in r)).toHaveLength(10);
    expect(results.filter((r) => 'spent' in r && r.spent === 'member')).toHaveLength(20);
  });

  it('a reservation given back (the send failed) frees its place', async () => {
    const action = `report.send.test-${Date.now()}-b`;
    const first = await Promise.all(Array.from({ length: 10 }, () => audit.reserveAction(shopId, userId, action, limits, subject, {})));
    expect(await audit.reserveAction(shopId, userId, action, limits, subject, {})).toEqual({ spent: 'member' });
    const one = first[0] as { id: string };
    await audit.releaseAction(shopId, one.id);
    expect('id' in (await audit.reserveAction(shopId, userId, action, limits, subject, {}))).toBe(true);
  });
});
