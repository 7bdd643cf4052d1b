/**
 * Share links at the data layer, on a throwaway embedded database: 256-bit tokens stored only as SHA-256 hashes;
 * expired, revoked and guessed tokens resolve to nothing (the route then answers 404 with no hint which).
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';

process.env.CRANKPRINT_DATA_DIR = mkdtempSync(join(tmpdir(), 'crankprint-share-'));
process.env.CRANKPRINT_DEMO = '1';

const { getDb } = await import('@/db/client');
const schema = await import('@/db/schema');
const q = await import('@/db/queries/reports');

let shopId = '';
let reportId = '';
let userId = '';

beforeAll(async () => {
  const db = await getDb();
  const [job] = await db.select().from(schema.jobs).limit(1);
  const [analysis] = await db.select().from(schema.analyses).limit(1);
  const [user] = await db.select().from(schema.users).limit(1);
  shopId = job.shopId;
  userId = user.id;
  const draft = await q.saveDraft(shopId, (await db.select().from(schema.captures).where(eq(schema.captures.id, analysis.captureId)))[0].jobId, {
    analysisIds: [analysis.id],
    conditions: {},
    interpretation: '',
    nextSteps: [],
  });
  reportId = (await q.signReport(shopId, draft.id, userId))!.id;
}, 60_000);

describe('share links', () => {
  it('a token is 256 random bits and only its hash is stored', async () => {
    const { token, link } = await q.createShareLink(shopId, reportId, userId);
    expect(Buffer.from(token, 'base64url').length).toBe(32);
    expect(link.tokenHash).toBe(q.hashToken(token));
    expect(JSON.stringify(link)).not.toContain(token);
    expect((await q.findShareLink(token))?.id).toBe(link.id);
    expect(link.expiresAt.getTime() - Date.now()).toBeGreaterThan(13.9 * 86_400_000);
  });

  it('an expired link opens nothing', async () => {
    const { token, link } = await q.createShareLink(shopId, reportId, userId);
    const db = await getDb();
    await db.update(schema.shareLinks).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(schema.shareLinks.id, link.id));
    expect(await q.findShareLink(token)).toBeNull();
  });

  it('a revoked link opens nothing', async () => {
    const { token, link } = await q.createShareLink(shopId, reportId, userId);
    await q.revokeShareLink(shopId, link.id);
    expect(await q.findShareLink(token)).toBeNull();
  });

  it('guessed tokens open nothing', async () => {
    for (const guess of ['', 'abc', 'A'.repeat(43), `${'a'.repeat(42)}'`, '../../etc']) expect(await q.findShareLink(guess)).toBeNull();
  });

  it('a decision is recorded against the revision the customer saw', async () => {
    const { token } = await q.createShareLink(shopId, reportId, userId);
    const link = (await q.findShareLink(token))!;
    const a = await q.recordApproval(link, 1, 'approve', 'Pat Customer');
    expect(a.created).toMatchObject({ revision: 1, decision: 'approve', typedName: 'Pat Customer', reportId });
  });

  it('one answer per revision per link: a later one is refused and the first stands', async () => {
    const { token } = await q.createShareLink(shopId, reportId, userId);
    const link = (await q.findShareLink(token))!;
    expect((await q.recordApproval(link, 1, 'approve', 'Pat Customer')).created).not.toBeNull();
    const again = await q.recordApproval(link, 1, 'decline', 'Someone Else');
    expect(again.created).toBeNull();
    expect(again.earlier).toMatchObject({ decision: 'approve', typedName: 'Pat Customer' });
  });
});
