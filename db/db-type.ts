/** The database handle's type, apart from the client that opens it, so storage code can name it without importing the client. */
import type { PgliteDatabase } from 'drizzle-orm/pglite';
import type * as schema from './schema';

export type Db = PgliteDatabase<typeof schema>;
