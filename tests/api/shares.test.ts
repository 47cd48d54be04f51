import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import { and, eq, isNull } from 'drizzle-orm';

import { shares, specifications } from '../../server/db/schema';
import type { ApprovedFormula } from '../../src/shared/schemas/formulas';
import type { ShareCreated, ShareDetail, ShareTarget } from '../../src/shared/schemas/shares';
import { createOrganization, createUser, signedInClient, type Client } from '../helpers/accounts';
import { organizationId, signInAsDemo, startDemoApp } from '../helpers/demo';
import { waitForMail, type TestApp } from '../helpers/app';

/**
 * Sharing at the demo scenario: the advisor (Upper Wend, also advisor at Tamsby and at Orrin Hollow)
 * shares Tamsby's approved broiler starter and a ration check with Orrin Hollow Larvae Farm.
 */
describe('shares API', () => {
  let app: TestApp;
  let advisor: Client;
  let farmer: Client;
  let operator: Client;
  let stranger: Client;
  let orrinId: number;
  let upperWendId: number;
  let tamsbyId: number;
  let approved: ApprovedFormula;
  let created: ShareCreated;

  before(async () => {
    app = await startDemoApp('shares_api');
    const db = app.database.db;
    const base = app.server.baseUrl;
    const org = (name: string) => organizationId(db, name);
    [orrinId, upperWendId, tamsbyId] = [await org('Orrin Hollow Larvae Farm'), await org('Upper Wend Extension Office'), await org('Tamsby Cooperative Feed Mill')];
    advisor = await signInAsDemo(base, 'advisor@upperwend.example');
    await advisor.call('PUT', '/api/auth/active-organization', { organizationId: tamsbyId });
    farmer = await signInAsDemo(base, 'farmer@orrinhollow.example');
    operator = await signInAsDemo(base, 'operator@tamsby.example');
    const elsewhere = await createOrganization(db, 'Lower Wend Hen Farm', 'farm');
    await createUser(db, { email: 'keeper@lowerwend.example', organizationId: elsewhere.id, role: 'owner' });
    stranger = await signedInClient(base, 'keeper@lowerwend.example');
    approved = ((await advisor.call('GET', '/api/formulas/approved')).body as ApprovedFormula[])[0];
  });
  after(async () => app?.close());

  describe('GET /api/shares/targets', () => {
    test('lists the farms the advisor belongs to, not the advisory office or the mill', async () => {
      const { status, body } = await advisor.call('GET', '/api/shares/targets');
      assert.equal(status, 200);
      assert.deepEqual((body as ShareTarget[]).map((t) => t.id), [orrinId]);
    });
  });

  describe('POST /api/shares', () => {
    test('shares an approved formula version: the farm’s member gets a mail with the link and the CSV', async () => {
      const { status, body } = await advisor.call('POST', '/api/shares', { kind: 'formula_version', formulaId: approved.formulaId, versionId: approved.version.id, toOrganizationId: orrinId, note: 'For your starter batches.' });
      assert.equal(status, 201);
      created = body as ShareCreated;
      // Every member of the farm except the sender: its owner and its farm worker (demo accounts).
      assert.deepEqual([...created.recipients].sort(), ['farmer@orrinhollow.example', 'worker@orrinhollow.example']);
      assert.match(created.link, /\/shared\/[A-Za-z0-9_-]{16,}$/);
      const mail = await waitForMail(app.inbox, (m) => m.to.includes('farmer@orrinhollow.example') && m.subject.includes('Broiler starter'));
      assert.ok(mail.text.includes(created.link), 'the mail carries the link');
      assert.match(mail.text, /For your starter batches\./);
      assert.match(mail.text, /veterinarian or qualified animal nutritionist/);
      assert.equal(mail.attachments.length, 1);
      assert.match(mail.attachments[0].filename, /\.csv$/);
      assert.match(mail.attachments[0].contentType, /text\/csv/);
    });

    test('shares a ration check, recomputed on the server', async () => {
      const starterId = (await app.database.db.select().from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, 'nrc1994-broiler-starter'))))[0].id;
      const check = { specificationId: starterId, lines: [{ name: 'Maize', kg: 700, pricePerKg: 0.229, values: { lys: 0.26 } }, { name: 'Soybean meal', kg: 300, pricePerKg: 0.512, values: { lys: 2.96 } }] };
      const { status, body } = await advisor.call('POST', '/api/shares', { kind: 'ration_check', check, toOrganizationId: orrinId });
      assert.equal(status, 201);
      const detail = (await farmer.call('GET', `/api/shares/${(body as ShareCreated).token}`)).body as ShareDetail;
      assert.equal(detail.payload.kind, 'ration_check');
      if (detail.payload.kind === 'ration_check') assert.equal(detail.payload.check.result.findings.find((f) => f.id === 'lys')!.kind, 'short');
    });

    test('returns 400 for an organization that is not one of the advisor’s farms, and writes nothing', async () => {
      const before = (await app.database.db.select().from(shares)).length;
      for (const toOrganizationId of [upperWendId, tamsbyId, 999999]) {
        const res = await advisor.call('POST', '/api/shares', { kind: 'formula_version', formulaId: approved.formulaId, versionId: approved.version.id, toOrganizationId });
        assert.equal(res.status, 400, `to ${toOrganizationId}`);
        assert.ok(res.body.error.fieldErrors.toOrganizationId);
      }
      assert.equal((await app.database.db.select().from(shares)).length, before);
    });

    test('returns 403 for a mill operator', async () => {
      assert.equal((await operator.call('POST', '/api/shares', { kind: 'formula_version', formulaId: approved.formulaId, versionId: approved.version.id, toOrganizationId: orrinId })).status, 403);
    });
  });

  describe('GET /api/shares/:token', () => {
    test('opens read-only for the farm’s member, whichever organization is active in the session', async () => {
      // The farmer's first membership is Tamsby (farm member there): the share still opens.
      const { status, body } = await farmer.call('GET', `/api/shares/${created.token}`);
      assert.equal(status, 200);
      const d = body as ShareDetail;
      assert.equal(d.toOrganization, 'Orrin Hollow Larvae Farm');
      assert.equal(d.payload.kind, 'formula_version');
      const csv = await fetch(`${app.server.baseUrl}/api/shares/${created.token}/csv`, { headers: { cookie: farmer.cookie! } });
      assert.equal(csv.status, 200);
      assert.match(await csv.text(), /Ingredient,Share \(%\)/);
    });

    test('answers 404 to a member of another organization, even one the sender belongs to', async () => {
      assert.equal((await stranger.call('GET', `/api/shares/${created.token}`)).status, 404);
      assert.equal((await operator.call('GET', `/api/shares/${created.token}`)).status, 404);
      assert.equal((await stranger.call('GET', `/api/shares/${created.token}/csv`)).status, 404);
    });

    test('keeps opening, and stays in the farm’s list, after the mill archives the formula', async () => {
      const nutritionist = await signInAsDemo(app.server.baseUrl, 'nutritionist@tamsby.example');
      assert.equal((await nutritionist.call('POST', `/api/formulas/${approved.formulaId}/archive`)).status, 200);
      try {
        const { status, body } = await farmer.call('GET', `/api/shares/${created.token}`);
        assert.equal(status, 200);
        assert.equal((body as ShareDetail).payload.kind, 'formula_version');
        const csv = await fetch(`${app.server.baseUrl}/api/shares/${created.token}/csv`, { headers: { cookie: farmer.cookie! } });
        assert.equal(csv.status, 200);
        const worker = await signInAsDemo(app.server.baseUrl, 'worker@orrinhollow.example');
        assert.ok(((await worker.call('GET', '/api/shares')).body as { token: string }[]).some((s) => s.token === created.token));
      } finally {
        assert.equal((await nutritionist.call('POST', `/api/formulas/${approved.formulaId}/restore`)).status, 200);
      }
    });

    test('a version of an archived formula is not sent again until the formula is restored, and nothing is written', async () => {
      const nutritionist = await signInAsDemo(app.server.baseUrl, 'nutritionist@tamsby.example');
      assert.equal((await nutritionist.call('POST', `/api/formulas/${approved.formulaId}/archive`)).status, 200);
      try {
        const before = (await app.database.db.select().from(shares)).length;
        const refused = await advisor.call('POST', '/api/shares', { kind: 'formula_version', formulaId: approved.formulaId, versionId: approved.version.id, toOrganizationId: orrinId });
        assert.equal(refused.status, 409);
        assert.equal(refused.body.error.code, 'archived');
        assert.match(refused.body.error.message, /restore it first/);
        assert.equal((await app.database.db.select().from(shares)).length, before);
      } finally {
        assert.equal((await nutritionist.call('POST', `/api/formulas/${approved.formulaId}/restore`)).status, 200);
      }
    });

    test('the farm lists what was shared with it', async () => {
      await farmer.call('PUT', '/api/auth/active-organization', { organizationId: orrinId });
      const list = (await farmer.call('GET', '/api/shares')).body as { token: string }[];
      assert.ok(list.some((s) => s.token === created.token));
      assert.deepEqual((await operator.call('GET', '/api/shares')).body, []);
    });
  });
});
