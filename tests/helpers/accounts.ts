import { generateIdFromEntropySize } from 'lucia';

import { hashPassword } from '../../server/auth/passwords';
import type { Db } from '../../server/db/client';
import { memberships, organizations, users } from '../../server/db/schema';
import type { Role } from '../../src/shared/permissions';
import { requestJson } from './http';

export const FIXTURE_PASSWORD = 'fixture-password-42';

let cachedHash: Promise<string> | undefined;

/** Creates a user (all fixtures share one password, hashed once) and, when given, a membership. */
export async function createUser(db: Db, { email, name, organizationId, role }: { email: string; name?: string; organizationId?: number; role?: Role }) {
  cachedHash ??= hashPassword(FIXTURE_PASSWORD);
  const id = generateIdFromEntropySize(10);
  await db.insert(users).values({ id, email, name: name ?? email.split('@')[0], passwordHash: await cachedHash });
  if (organizationId && role) await db.insert(memberships).values({ userId: id, organizationId, role });
  return { id, email };
}

export async function createOrganization(db: Db, name: string, kind: 'feed_mill' | 'farm' | 'advisory' = 'feed_mill') {
  const [row] = await db.insert(organizations).values({ name, kind }).$returningId();
  return { id: row.id };
}

/** A client that keeps the session cookie and sends the Origin header, as the web app does. */
export type Client = {
  cookie: string | undefined;
  call: (method: string, path: string, body?: unknown) => Promise<{ status: number; body: any; headers: Headers }>;
};

export function client(baseUrl: string, cookie?: string): Client {
  const self: Client = {
    cookie,
    call: async (method, path, body) => {
      const response = await requestJson(baseUrl, path, {
        method,
        body: body === undefined ? undefined : JSON.stringify(body),
        headers: { origin: baseUrl, ...(self.cookie ? { cookie: self.cookie } : {}) },
      });
      const setCookie = response.headers.get('set-cookie');
      if (setCookie) self.cookie = setCookie.split(';')[0];
      return response;
    },
  };
  return self;
}

export async function signedInClient(baseUrl: string, email: string, password = FIXTURE_PASSWORD): Promise<Client> {
  const c = client(baseUrl);
  const { status, body } = await c.call('POST', '/api/auth/sign-in', { email, password });
  if (status !== 200) throw new Error(`Sign-in as ${email} failed: ${status} ${JSON.stringify(body)}`);
  return c;
}
