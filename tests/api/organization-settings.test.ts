import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';

import { createOrganization, createUser, signedInClient, type Client } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';

describe('organization settings API', () => {
  let app: TestApp;
  let owner: Client;
  let nutritionist: Client;
  let outsider: Client;

  before(async () => {
    app = await startTestApp('org_settings_api');
    const db = app.database.db;
    const mill = await createOrganization(db, 'Settings Test Mill');
    const other = await createOrganization(db, 'Settings Other Farm', 'farm');
    await createUser(db, { email: 'owner@settings.example', organizationId: mill.id, role: 'owner' });
    await createUser(db, { email: 'nutritionist@settings.example', organizationId: mill.id, role: 'nutritionist' });
    await createUser(db, { email: 'owner@other.example', organizationId: other.id, role: 'owner' });
    owner = await signedInClient(app.server.baseUrl, 'owner@settings.example');
    nutritionist = await signedInClient(app.server.baseUrl, 'nutritionist@settings.example');
    outsider = await signedInClient(app.server.baseUrl, 'owner@other.example');
  });
  after(async () => app?.close());

  describe('GET /api/organization-settings', () => {
    test('answers metric and EUR until an owner changes them', async () => {
      const { status, body } = await nutritionist.call('GET', '/api/organization-settings');
      assert.equal(status, 200);
      assert.equal(body.unitSystem, 'metric');
      assert.equal(body.currency, 'EUR');
      assert.equal(body.updatedAt, null);
    });
  });

  describe('PUT /api/organization-settings', () => {
    test('saves US units and a currency (upper-cased) for the owner’s organization only', async () => {
      const { status, body } = await owner.call('PUT', '/api/organization-settings', { unitSystem: 'us', currency: 'usd' });
      assert.equal(status, 200);
      assert.equal(body.unitSystem, 'us');
      assert.equal(body.currency, 'USD');
      assert.equal((await nutritionist.call('GET', '/api/organization-settings')).body.currency, 'USD');
      assert.equal((await outsider.call('GET', '/api/organization-settings')).body.unitSystem, 'metric');
    });

    test('saving again replaces the row', async () => {
      assert.equal((await owner.call('PUT', '/api/organization-settings', { unitSystem: 'metric', currency: 'KES' })).status, 200);
      const { body } = await owner.call('GET', '/api/organization-settings');
      assert.deepEqual([body.unitSystem, body.currency], ['metric', 'KES']);
    });

    test('returns 400 with field errors for an unknown unit system or a malformed currency, and keeps what was saved', async () => {
      const bad = await owner.call('PUT', '/api/organization-settings', { unitSystem: 'imperial', currency: 'EURO' });
      assert.equal(bad.status, 400);
      assert.ok(bad.body.error.fieldErrors.unitSystem);
      assert.match(bad.body.error.fieldErrors.currency[0], /three-letter/);
      assert.equal((await owner.call('GET', '/api/organization-settings')).body.currency, 'KES');
    });

    test('returns 403 for a nutritionist', async () => {
      assert.equal((await nutritionist.call('PUT', '/api/organization-settings', { unitSystem: 'us', currency: 'USD' })).status, 403);
    });
  });
});
