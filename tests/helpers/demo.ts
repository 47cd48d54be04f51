import { eq } from 'drizzle-orm';

import type { AppOptions } from '../../server/app';
import type { Db } from '../../server/db/client';
import { DEMO_PASSWORD } from '../../server/db/demo/accounts';
import { organizations } from '../../server/db/schema';
import { seedDemoData } from '../../server/db/seed';
import { signedInClient, type Client } from './accounts';
import { startTestApp, type TestApp } from './app';

/** The whole app on a fresh database that holds the reference library and the invented demo scenario. */
export async function startDemoApp(label: string, options: Partial<AppOptions> = {}): Promise<TestApp> {
  const app = await startTestApp(label, options);
  await seedDemoData(app.database.db);
  return app;
}

/** Signs in as one of the demo accounts (server/db/demo/accounts.ts). */
export const signInAsDemo = (baseUrl: string, email: string): Promise<Client> => signedInClient(baseUrl, email, DEMO_PASSWORD);

/** The id of a demo organization, by its name. */
export async function organizationId(db: Db, name: string): Promise<number> {
  const [row] = await db.select({ id: organizations.id }).from(organizations).where(eq(organizations.name, name));
  if (!row) throw new Error(`No organization named ${name}`);
  return row.id;
}
