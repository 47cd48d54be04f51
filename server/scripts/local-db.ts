/**
 * The development database: a private MariaDB in .data/mariadb on DB_PORT, with the app's database,
 * its user, migrations and the demo data. Shared by `npm start`, `npm run dev` and `npm run db:*`.
 */
import { fileURLToPath } from 'node:url';

import { openDb } from '../db/client';
import { describeInstance, ensureDatabase, startMariadb } from '../db/mariadb';
import { applyMigrations } from '../db/migrate';
import { seedDemoData } from '../db/seed';
import { databaseUrl, DEV_DATABASE, DEV_DB_USER, type Env } from '../env';

export const DEV_DATA_DIR = fileURLToPath(new URL('../../.data/mariadb', import.meta.url));

export const devInstance = (env: Env) => describeInstance(DEV_DATA_DIR, env.DB_PORT);

/** Starts the private server if needed, then migrates and seeds. Data survives between starts. */
export async function prepareLocalDatabase(env: Env, { seed = true } = {}): Promise<string> {
  const url = databaseUrl(env);
  if (!env.DATABASE_URL) {
    const instance = devInstance(env);
    const started = await startMariadb(instance);
    console.log(started ? `MariaDB started on 127.0.0.1:${env.DB_PORT} (data in .data/mariadb)` : `MariaDB already running on 127.0.0.1:${env.DB_PORT}`);
    ensureDatabase(instance, DEV_DATABASE, DEV_DB_USER, env.DB_PASSWORD);
  }
  const handle = openDb(url);
  try {
    await applyMigrations(handle.db);
    if (seed) {
      const applied = await seedDemoData(handle.db);
      if (applied.length) console.log(`Demo data added: ${applied.join(', ')}`);
    }
  } finally {
    await handle.close();
  }
  return url;
}
