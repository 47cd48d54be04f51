import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/mysql2/migrator';

import type { Db } from './client';

const MIGRATIONS = fileURLToPath(new URL('../../drizzle/migrations', import.meta.url));

/** Applies every migration in drizzle/migrations that has not run yet on this database. */
export async function applyMigrations(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder: MIGRATIONS });
}
