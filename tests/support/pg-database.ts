/**
 * Vitest setup for the PostgreSQL pass of `npm test`: when CRANKPRINT_TEST_PG_URL names a server, each test
 * file gets a fresh database on it as DATABASE_URL, so the one database client opens PostgreSQL instead of
 * the embedded database.
 */
import { createDatabase } from '../../scripts/pg-server.mjs';

if (process.env.CRANKPRINT_TEST_PG_URL) {
  process.env.DATABASE_URL = await createDatabase(process.env.CRANKPRINT_TEST_PG_URL, 'vitest');
}
