/**
 * A database error in the log: a real foreign-key violation (an analysis of a capture that is not there, with a
 * result and a trace as large as a real one) is logged by safeError as one short line that names the constraint
 * and holds nothing of the result or the trace (the query's parameters).
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '@/db/client';
import { analyses } from '@/db/schema';
import { safeError } from '@/server/log';
import { seededDemo } from '../support/seeded-db';

let db: Db;
let shopId: string;

beforeAll(async () => {
  ({ db, shopId } = await seededDemo(mkdtempSync(join(tmpdir(), 'crankprint-log-'))));
}, 60_000);

describe('a database error as the log keeps it', () => {
  it('names the constraint in one short line, without the result or the trace it was writing', async () => {
    const [any] = await db.select().from(analyses).limit(1);
    const marker = 'CAPTURE-DATA-MARKER';
    const trace = { samples: Array.from({ length: 4000 }, (_, i) => i * 0.5), note: marker };
    const error = await db
      .insert(analyses)
      .values({ ...any, id: crypto.randomUUID(), shopId, captureId: 'no-such-capture', result: { ...any.result, marker } as typeof any.result, trace: trace as unknown as typeof any.trace })
      .then(
        () => null,
        (e: unknown) => e,
      );
    expect(error).toBeInstanceOf(Error);
    const line = JSON.stringify(safeError(error));
    expect(line).toMatch(/foreign key/);
    expect(line).not.toContain(marker);
    expect(line).not.toContain('1999.5');
    expect(line.length).toBeLessThan(3_000);
    // What pino would have written without it: the whole query with its parameters.
    expect(String((error as Error).message).length).toBeGreaterThan(10_000);
  });
});
