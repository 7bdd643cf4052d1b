/** Rate-limit counters shared by every instance on one PostgreSQL server (rate-limiter-flexible's drizzle store). */
import { integer, pgTable, text, timestamp } from 'drizzle-orm/pg-core';

export const rateLimits = pgTable('rate_limits', {
  key: text().primaryKey(),
  points: integer().notNull().default(0),
  expire: timestamp({ withTimezone: true }),
});
