// PRODUCT.md's role table as access-control statements.
import { describe, expect, it } from 'vitest';
import { can } from '@/server/permissions';

describe('roles (PRODUCT.md)', () => {
  it('owners may do everything, including members and invitations', () => {
    expect(can('owner', { member: ['update', 'delete'], invitation: ['create'], profile: ['create'], shop: ['retention'] })).toBe(true);
  });
  it('technicians create jobs, upload, save analyses and sign reports, but do not manage members', () => {
    expect(can('technician', { job: ['create'], capture: ['upload'], analysis: ['save'], report: ['sign'] })).toBe(true);
    expect(can('technician', { member: ['update'] })).toBe(false);
    expect(can('technician', { invitation: ['create'] })).toBe(false);
  });
  it('advisors read, send and share; never upload, edit or delete', () => {
    expect(can('advisor', { job: ['read'], report: ['send', 'share'] })).toBe(true);
    for (const p of [{ job: ['create'] }, { capture: ['upload'] }, { report: ['edit'] }, { job: ['delete'] }, { analysis: ['save'] }] as const) {
      expect(can('advisor', p as never)).toBe(false);
    }
  });
  it('an unknown role may do nothing', () => {
    expect(can('member', { job: ['read'] })).toBe(false);
  });
});
