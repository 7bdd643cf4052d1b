/** Objects whose rows are gone and which object storage still has to remove: retried until it does. */
import { integer, jsonb, pgTable, text, timestamp } from 'drizzle-orm/pg-core';

export const pendingObjectDeletes = pgTable('pending_object_deletes', {
  /** The object's address, s3://bucket/key. */
  url: text().primaryKey(),
  attempts: integer().notNull().default(0),
  /** The last failure, one line (never capture contents). */
  lastError: text(),
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  triedAt: timestamp({ withTimezone: true }),
});

/** Work one instance of a fleet does for all (the daily retention sweep): when it last ran, and what it did. */
export const maintenanceRuns = pgTable('maintenance_runs', {
  name: text().primaryKey(),
  lastRunAt: timestamp({ withTimezone: true }).notNull(),
  detail: jsonb(),
});
