/**
 * The one database client per process. Embedded PGlite in the data directory by default — opened lazily on
 * first use, kept once per process (db/process-state.mjs) so every route bundle shares it, migrated once behind one promise, guarded by a
 * PID lock (on a server, migrated under an advisory lock, so a fleet may start at once) and closed by the server on SIGINT/SIGTERM once the requests under way have finished. With DATABASE_URL it is a
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
import { CHANGES_CHANNEL, type ChangeTopic, heard, listenForChanges } from './changes';
import { processShared } from './process-state.mjs';

export type { Db } from './db-type';
import type { Db } from './db-type';

export interface OpenOptions {
  /** postgres://… to use a server. */
  url?: string;
  /** Data directory for the embedded database, or 'memory' for a throwaway one. */
  dataDir?: string;
  /** Work to do once migrated, still under the start lock (the demo seed), so two instances never both do it. */
  afterMigrate?: (db: Db) => Promise<unknown>;
}

/**
 * Any number of instances may start at once on one PostgreSQL server: each takes this session-level advisory
 * lock before migrating, so one migrates while the others wait and then find the schema migrated. The lock is
 * the server's: it goes when its connection does, a killed instance included.
 */
const START_LOCK = 'crankprint:migrate';

async function underStartLock<T>(pool: pg.Pool, work: () => Promise<T>): Promise<T> {
  const client = await pool.connect();
  try {
    await client.query('select pg_advisory_lock(hashtext($1))', [START_LOCK]);
    try {
      return await work();
    } finally {
      await client.query('select pg_advisory_unlock(hashtext($1))', [START_LOCK]);
    }
  } finally {
    client.release();
  }
}

export interface Database {
  db: Db;
  kind: 'pglite' | 'postgres';
  /** Tells every instance on this database (this one included) that `topic` changed (db/changes.ts). */
  announce(topic: ChangeTopic): Promise<void>;
  close(): Promise<void>;
}

/** In one process (the embedded database) a change is heard where it is made. */
const announceHere = async (topic: ChangeTopic) => heard(topic);

export const MIGRATIONS_FOLDER = resolve(/*turbopackIgnore: true*/ process.cwd(), 'db/migrations');

/** Opens and migrates a database. Most code calls {@link getDb} instead. */
export async function openDatabase(o: OpenOptions = {}): Promise<Database> {
  if (o.url) {
    const pool = new pg.Pool({ connectionString: o.url, max: 10 });
    const db = drizzlePg(pool, { schema, casing: 'snake_case' }) as unknown as Db;
    try {
      await underStartLock(pool, async () => {
        await migratePg(db as never, { migrationsFolder: MIGRATIONS_FOLDER });
        await o.afterMigrate?.(db);
      });
    } catch (e) {
      await pool.end().catch(() => {});
      throw e;
    }
    const stopListening = await listenForChanges(o.url, (e) => console.warn(`database: the change listener lost its connection (${e instanceof Error ? e.message : String(e)}); retrying`));
    return {
      db,
      kind: 'postgres',
      announce: async (topic) => {
        heard(topic);
        await pool.query('select pg_notify($1, $2)', [CHANGES_CHANNEL, topic]);
      },
      close: async () => {
        await stopListening();
        await pool.end();
      },
    };
  }
  if (!o.dataDir || o.dataDir === 'memory') {
    const client = new PGlite();
    const db = drizzlePglite(client, { schema, casing: 'snake_case' });
    await migratePglite(db, { migrationsFolder: MIGRATIONS_FOLDER });
    await o.afterMigrate?.(db);
    return { db, kind: 'pglite', announce: announceHere, close: () => client.close() };
  }
  const dir = resolve(/*turbopackIgnore: true*/ o.dataDir);
  mkdirSync(/*turbopackIgnore: true*/ dir, { recursive: true });
  const release = acquireLock(join(dir, 'pglite.lock'), dir);
  try {
    const client = new PGlite(join(dir, 'pglite'));
    const db = drizzlePglite(client, { schema, casing: 'snake_case' });
    await migratePglite(db, { migrationsFolder: MIGRATIONS_FOLDER });
    await o.afterMigrate?.(db);
    return {
      db,
      kind: 'pglite',
      announce: announceHere,
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
// One per process, whichever route bundle asks (db/process-state.mjs); the server closes it when it stops
// (server/lifecycle.mjs).
const holder: Holder = processShared('database', () => ({}));

/** The process's database, opened and migrated on first use. Every handler awaits this before a query. */
export function getDatabase(): Promise<Database> {
  holder.ready ??= (async () => {
    // Demo mode seeds an invented shop into an empty database (under the start lock, so once in a fleet).
    const afterMigrate = process.env.CRANKPRINT_DEMO === '1' ? async (db: Db) => (await import('./seed')).seedDemoIfEmpty(db) : undefined;
    const d = await openDatabase(process.env.DATABASE_URL ? { url: process.env.DATABASE_URL, afterMigrate } : { dataDir: dataDir(), afterMigrate });
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
