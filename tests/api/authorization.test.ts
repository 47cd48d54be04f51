import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';

import { ROLES } from '../../src/shared/permissions';
import { client, createOrganization, createUser, signedInClient, type Client } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';
import { listRoutes } from '../helpers/routes';
import * as ruleSets from './authorization';
import { CALLERS, type AuthWorld, type Caller, type RouteCase } from './authorization/types';

/**
 * Calls every API route as each role of organization A, as the owner of organization B (outsider) and
 * signed out, and checks each answer against the table. A route the app answers without a row fails.
 */
describe('authorization table', () => {
  let testApp: TestApp;
  let world: AuthWorld;
  let cases: (RouteCase & { area: string })[] = [];
  const sessions = new Map<Caller, Client>();

  const sessionFor = async (caller: Caller, fresh = false): Promise<Client> => {
    if (caller === 'signed_out') return client(testApp.server.baseUrl);
    if (fresh) return signedInClient(testApp.server.baseUrl, world.emails[caller]);
    if (!sessions.has(caller)) sessions.set(caller, await signedInClient(testApp.server.baseUrl, world.emails[caller]));
    return sessions.get(caller)!;
  };

  before(async () => {
    testApp = await startTestApp('authz');
    const db = testApp.database.db;
    const orgA = await createOrganization(db, 'Organization A Mill');
    const orgB = await createOrganization(db, 'Organization B Farm', 'farm');
    const userIds = {} as AuthWorld['userIds'];
    const emails = {} as AuthWorld['emails'];
    for (const role of ROLES) {
      emails[role] = `${role.replace('_', '-')}@a.example.org`;
      userIds[role] = (await createUser(db, { email: emails[role], organizationId: orgA.id, role })).id;
    }
    emails.outsider = 'owner@b.example.org';
    userIds.outsider = (await createUser(db, { email: emails.outsider, organizationId: orgB.id, role: 'owner' })).id;
    world = { db, orgA, orgB, userIds, emails };
    for (const set of Object.values(ruleSets)) cases.push(...(await set.cases(world)).map((c) => ({ ...c, area: set.area })));
  });
  after(async () => testApp?.close());

  test('every API route declares who may call it', async () => {
    const { createApp } = await import('../../server/app');
    const routes = listRoutes(createApp({ db: testApp.database.db }));
    assert.ok(routes.length > 10, 'the walk found the API routes');
    const unguarded = routes.filter((route) => route.pattern.startsWith('/api') && !route.rule).map((r) => `${r.method} ${r.pattern}`);
    assert.deepEqual(unguarded, [], 'routes without an access guard');
  });

  test('every API route has a row in the table, and every row names a real route', async () => {
    const { createApp } = await import('../../server/app');
    const routes = listRoutes(createApp({ db: testApp.database.db })).filter((r) => r.pattern.startsWith('/api'));
    const key = (method: string, pattern: string) => `${method} ${pattern}`;
    const rows = new Set(cases.map((c) => key(c.method, c.pattern)));
    const declared = new Set(routes.map((r) => key(r.method, r.pattern)));
    assert.deepEqual([...declared].filter((k) => !rows.has(k)), [], 'routes with no row in the authorization table');
    assert.deepEqual([...rows].filter((k) => !declared.has(k)), [], 'rows for routes the app does not have');
  });

  test('each caller gets the expected answer from each route', async () => {
    const mismatches: string[] = [];
    for (const row of cases) {
      for (const caller of CALLERS) {
        const prepared = row.prepare ? await row.prepare(caller) : {};
        const session = await sessionFor(caller, row.freshSession);
        const url = prepared.url ?? row.url;
        const response = await session.call(row.method, url, prepared.body ?? row.body ?? (row.method === 'GET' || row.method === 'DELETE' ? undefined : {}));
        if (response.status !== row.expect[caller]) {
          mismatches.push(`${row.area}: ${row.method} ${url} as ${caller}: expected ${row.expect[caller]}, got ${response.status} ${JSON.stringify(response.body?.error?.message ?? '')}`);
        }
      }
    }
    assert.deepEqual(mismatches, []);
  });
});
