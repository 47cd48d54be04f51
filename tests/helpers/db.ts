import { randomBytes } from 'node:crypto';
import mysql from 'mysql2/promise';

import { openDb, type DbHandle } from '../../server/db/client';
import { applyMigrations } from '../../server/db/migrate';
import { testServerUrl } from './test-env';

export type TestDatabase = DbHandle & { name: string; drop: () => Promise<void> };

/**
 * A fresh, migrated database on the private test server, one per test file, so files can run in
 * parallel and no test ever sees the demo data. `drop()` removes it.
 */
export async function createTestDatabase(label: string): Promise<TestDatabase> {
  const name = `t_${label.replace(/[^a-z0-9]/gi, '_').slice(0, 30)}_${randomBytes(4).toString('hex')}`;
  const admin = await mysql.createConnection(testServerUrl(''));
  await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.end();
  const handle = openDb(testServerUrl(name));
  await applyMigrations(handle.db);
  return {
    ...handle,
    name,
    drop: async () => {
      await handle.close();
      const conn = await mysql.createConnection(testServerUrl(''));
      await conn.query(`DROP DATABASE IF EXISTS \`${name}\``);
      await conn.end();
    },
  };
}
