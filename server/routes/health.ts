import { sql } from 'drizzle-orm';
import { Router } from 'express';

import type { Health } from '../../src/shared/schemas/health';
import type { Db } from '../db/client';
import { access } from '../http/access';
import { APP_VERSION } from '../version';

const started = Date.now();

async function databaseAnswers(db: Db): Promise<boolean> {
  const timeout = new Promise<false>((resolve) => (setTimeout(() => resolve(false), 2000) as unknown as NodeJS.Timeout).unref());
  const ping = db.execute(sql`select 1`).then(() => true, () => false);
  return Promise.race([ping, timeout]);
}

/** GET /api/health: open to anyone (load balancers, the sign-in page); says nothing private. 503 when the database is down. */
export function healthRouter({ db }: { db: Db }): Router {
  const router = Router();
  router.get('/', access.public(), async (_req, res) => {
    const ok = await databaseAnswers(db);
    const body: Health = { version: APP_VERSION, database: ok ? 'ok' : 'down', uptimeSeconds: Math.round((Date.now() - started) / 1000) };
    res.status(ok ? 200 : 503).json(body);
  });
  return router;
}
