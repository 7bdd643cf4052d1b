/** The new-job form's odometer: grouped thousands as people write them (common practice), and what stays refused. */
import { describe, expect, it } from 'vitest';
import { jobSchema } from '@/domain/job';

const job = (odometer: unknown) => jobSchema.safeParse({ repairOrder: 'RO-1', concern: 'Misfire when cold.', vehicleId: 'v1', odometer });

describe('odometer', () => {
  it.each(['92400', '92,400', '92 400', '92.400', '92\u202f400', '1,234,567'])('reads %s', (v) => {
    const r = job(v);
    expect(r.success).toBe(true);
    expect(r.data!.odometer).toBe(Number(v.replace(/[^\d]/g, '')));
  });
  it.each(['92.4', '92,40', 'abc', '-5'])('refuses %s', (v) => {
    expect(job(v).success).toBe(false);
  });
  it('an empty field is no reading', () => {
    expect(job('').data!.odometer).toBeUndefined();
  });
});
