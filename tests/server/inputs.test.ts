/**
 * Input schemas that guard a record: a customer's typed name must hold letters you can see (a signature of
 * invisible characters is no signature), and a wheel setting is bounded before any parsing.
 */
import { describe, expect, it } from 'vitest';
import { analysisSettingsSchema } from '@/domain/analysis-settings';
import { decisionInput } from '@/server/api/inputs';

const token = 'x'.repeat(43);

describe('a typed name signs only with two visible letters', () => {
  it.each(['\u200b\u200b\u200b', '  ', 'A', '1 2', '\u200bA\u200b'])('refuses %j', (typedName) => {
    expect(decisionInput.safeParse({ token, decision: 'approve', typedName }).success).toBe(false);
  });
  it.each(['Pat', 'Jürgen Müller', '李明', 'Zoë “Z” O’Neil — 100%'])('takes %j', (typedName) => {
    expect(decisionInput.safeParse({ token, decision: 'approve', typedName }).success).toBe(true);
  });
});

describe('settings are bounded before they are parsed', () => {
  it('a wheel notation over 200 characters is refused with a sentence', () => {
    const r = analysisSettingsSchema.safeParse({ engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] }, teeth: `60:${'1,'.repeat(5000)}1` });
    expect(r.success).toBe(false);
    expect(JSON.stringify(r.error?.issues)).toContain('at most 200 characters');
  });
});

describe('rate-limit keys (RFC 4291 address forms)', () => {
  it('an IPv4 address written as IPv6 is the IPv4 client', async () => {
    const { clientKey } = await import('@/server/client-key');
    expect(clientKey('::ffff:203.0.113.7')).toBe('203.0.113.7');
    expect(clientKey('203.0.113.7')).toBe('203.0.113.7');
  });
  it('every address of one IPv6 /64 is one client; another /64 is another', async () => {
    const { clientKey } = await import('@/server/client-key');
    const a = clientKey('2001:db8:1:2::1');
    expect(clientKey('2001:0db8:0001:0002:ffff:ffff:ffff:fffe')).toBe(a);
    expect(clientKey('[2001:db8:1:2:abcd::9]')).toBe(a);
    expect(clientKey('2001:db8:1:3::1')).not.toBe(a);
    expect(clientKey('::1')).toBe('0:0:0:0::/64');
  });
});
