/**
 * The one database client per process. Embedded PGlite in the data directory by default — opened lazily on
 * first use, kept on globalThis so every route bundle shares it, migrated once behind one promise, guarded by a
 * PID lock and closed by the server on SIGINT/SIGTERM once the requests under way have finished. With DATABASE_URL it is a
 * PostgreSQL server through node-postgres, with the same migrations.
 */
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import { drizzle as drizzlePglite } from 'drizzle-orm/pglite';
import { migrate as migratePglite } from 'drizzle-orm/pglite/migrator';
import { drizzle as drizzlePg } from 'drizzle-orm/node-postgres';
import { migrate as migratePg } from 'drizzle-orm/node-postgres/migrator';
import pg from 'pg';
import * as schema from './schema';
import { acquireLock } from './lock';

export type { Db } from './db-type';
import type { Db } from './db-type';

export interface OpenOptions {
  /** postgres://… to use a server. */
  url?: string;
  /** Data directory for the embedded database, or 'memory' for a throwaway one. */
  dataDir?: string;
}

export interface Database {
  db: Db;
  kind: 'pglite' | 'postgres';
  close(): Promise<void>;
}

export const MIGRATIONS_FOLDER = resolve(/*turbopackIgnore: true*/ process.cwd(), 'db/migrations');

/** Opens and migrates a database. Most code calls {@link getDb} instead. */
export async function openDatabase(o: OpenOptions = {}): Promise<Database> {
  if (o.url) {
    const pool = new pg.Pool({ connectionString: o.url, max: 10 });
    const db = drizzlePg(pool, { schema, casing: 'snake_case' }) as unknown as Db;
    await migratePg(db as never, { migrationsFolder: MIGRATIONS_FOLDER });
    return { db, kind: 'postgres', close: () => pool.end() };
  }
  if (!o.dataDir || o.dataDir === 'memory') {
    const client = new PGlite();
    const db = drizzlePglite(client, { schema, casing: 'snake_case' });
    await migratePglite(db, { migrationsFolder: MIGRATIONS_FOLDER });
    return { db, kind: 'pglite', close: () => client.close() };
  }
  const dir = resolve(/*turbopackIgnore: true*/ o.dataDir);
  mkdirSync(/*turbopackIgnore: true*/ dir, { recursive: true });
  const release = acquireLock(join(dir, 'pglite.lock'), dir);
  try {
    const client = new PGlite(join(dir, 'pglite'));
    const db = drizzlePglite(client, { schema, casing: 'snake_case' });
    await migratePglite(db, { migrationsFolder: MIGRATIONS_FOLDER });
    return {
      db,
      kind: 'pglite',
      close: async () => {
        await client.close();
        release();
      },
    };
  } catch (e) {
    release();
    throw e;
  }
}

/** Where the embedded database lives: CRANKPRINT_DATA_DIR, default .data. */
export function dataDir(): string {
  return process.env.CRANKPRINT_DATA_DIR || '.data';
}

type Holder = { ready?: Promise<Database> };
const g = globalThis as unknown as { __crankprintDb?: Holder; __crankprintLife?: Life };
const holder: Holder = (g.__crankprintDb ??= {});

/** What the server (scripts/serve.mjs) shares with the app in its process: whether it is stopping. */
interface Life {
  stopping: boolean;
  cutOff: boolean;
  closeDatabase?: () => Promise<void>;
}
const life: Life = (g.__crankprintLife ??= { stopping: false, cutOff: false });

/** True once SIGTERM or SIGINT has arrived: handlers answer 503 rather than start work. */
export function shuttingDown(): boolean {
  return life.stopping;
}

/** True when the server is about to close the database: work still running (a long upload) gives up with a 503. */
export function pastCutOff(): boolean {
  return life.cutOff;
}

/** The process's database, opened and migrated on first use. Every handler awaits this before a query. */
export function getDatabase(): Promise<Database> {
  holder.ready ??= (async () => {
    const d = await openDatabase(process.env.DATABASE_URL ? { url: process.env.DATABASE_URL } : { dataDir: dataDir() });
    // The server closes it once the requests under way have finished (scripts/serve.mjs).
    life.closeDatabase = () => d.close();
    // Demo mode seeds an invented shop into an empty database.
    if (process.env.CRANKPRINT_DEMO === '1') await (await import('./seed')).seedDemoIfEmpty(d.db);
    return d;
  })().catch((e) => {
    holder.ready = undefined;
    throw e;
  });
  return holder.ready;
}

export async function getDb(): Promise<Db> {
  return (await getDatabase()).db;
}
