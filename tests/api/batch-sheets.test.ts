import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import { eq } from 'drizzle-orm';
import Papa from 'papaparse';

import { batchLogs, formulas, formulaVersions } from '../../server/db/schema';
import type { BatchLogEntry, BatchSheetResponse } from '../../src/shared/schemas/batch-sheets';
import type { ApprovedFormula } from '../../src/shared/schemas/formulas';
import type { Client } from '../helpers/accounts';
import { organizationId, signInAsDemo, startDemoApp } from '../helpers/demo';
import type { TestApp } from '../helpers/app';

const sum = (xs: number[]) => xs.reduce((s, x) => s + x, 0);

/** Batch sheets and the batch log at the demo mill (Tamsby Cooperative Feed Mill's approved broiler starter). */
describe('batch sheets API', () => {
  let app: TestApp;
  let operator: Client;
  let owner: Client;
  let farmer: Client;
  let approvedId: number;
  let draftId: number;

  before(async () => {
    app = await startDemoApp('batch_sheets_api');
    const db = app.database.db;
    const base = app.server.baseUrl;
    operator = await signInAsDemo(base, 'operator@tamsby.example');
    owner = await signInAsDemo(base, 'owner@tamsby.example');
    farmer = await signInAsDemo(base, 'farmer@orrinhollow.example');
    await farmer.call('PUT', '/api/auth/active-organization', { organizationId: await organizationId(db, 'Orrin Hollow Larvae Farm') });
    const approved = (await operator.call('GET', '/api/formulas/approved')).body as ApprovedFormula[];
    approvedId = approved[0].version.id;
    const [grower] = await db.select().from(formulas).where(eq(formulas.name, 'Broiler grower with larvae meal'));
    draftId = (await db.select().from(formulaVersions).where(eq(formulaVersions.formulaId, grower.id)))[0].id;
  });
  after(async () => app?.close());

  describe('GET /api/batch-sheets/:versionId', () => {
    test('amounts add up to the batch size within the main scale step, in the order of addition', async () => {
      for (const batchSize of [1000, 2000, 750, 333]) {
        const { status, body } = await operator.call('GET', `/api/batch-sheets/${approvedId}?batchSize=${batchSize}&macroStep=0.5&minorStep=0.01`);
        assert.equal(status, 200);
        const sheet = (body as BatchSheetResponse).sheet;
        assert.ok(Math.abs(sum(sheet.lines.map((l) => l.amount)) - batchSize) <= 0.25 + 1e-9, `batch ${batchSize}: ${sum(sheet.lines.map((l) => l.amount))}`);
        const groups = sheet.lines.map((l) => l.group);
        assert.deepEqual(groups, [...groups].sort((a, b) => ['macro', 'minor', 'liquid'].indexOf(a) - ['macro', 'minor', 'liquid'].indexOf(b)), 'macro, then minor, then liquids');
      }
    });

    test('names the version, its approval, the currency and calls out the premix or micro-ingredients', async () => {
      const { body } = await operator.call('GET', `/api/batch-sheets/${approvedId}`);
      const b = body as BatchSheetResponse;
      assert.equal(b.formulaName, 'Broiler starter');
      assert.equal(b.version.approval, 'current');
      assert.ok(b.version.approvedBy);
      assert.equal(b.massUnit, 'kg');
      assert.equal(b.measures.currency, 'EUR');
      assert.ok(b.sheet.lines.some((l) => l.group === 'minor' && l.callOut), 'a minor ingredient is called out');
    });

    test('the CSV carries the caution, every ingredient and the total', async () => {
      const res = await fetch(`${app.server.baseUrl}/api/batch-sheets/${approvedId}/csv?batchSize=1500`, { headers: { cookie: operator.cookie! } });
      assert.equal(res.status, 200);
      assert.match(res.headers.get('content-type')!, /text\/csv/);
      assert.match(res.headers.get('content-disposition')!, /attachment; filename="?batch-broiler-starter-v1-1500kg\.csv/);
      const rows = Papa.parse<string[]>(await res.text()).data;
      assert.match(rows[0][0], /veterinarian or qualified animal nutritionist/);
      const header = rows.findIndex((r) => r[0] === 'Order');
      const total = rows.find((r) => r[1] === 'Total')!;
      const lines = rows.slice(header + 1, rows.indexOf(total));
      assert.ok(lines.length >= 3);
      assert.ok(Math.abs(sum(lines.map((r) => Number(r[3]))) - 1500) <= 0.25 + 1e-9);
      assert.ok(Math.abs(Number(total[3]) - 1500) <= 0.25 + 1e-9);
    });

    test('returns 404 for a version that is not the current approved one, and 400 for a bad size', async () => {
      assert.equal((await operator.call('GET', `/api/batch-sheets/${draftId}`)).status, 404);
      const bad = await operator.call('GET', `/api/batch-sheets/${approvedId}?batchSize=-5`);
      assert.equal(bad.status, 400);
      assert.match(JSON.stringify(bad.body.error.fieldErrors), /more than 0/);
    });

    test('returns 404 for a member of another organization', async () => {
      assert.equal((await farmer.call('GET', `/api/batch-sheets/${approvedId}`)).status, 404);
    });
  });

  describe('POST /api/batches', () => {
    test('records a batch as made and lists it in the log', async () => {
      const { status, body } = await operator.call('POST', '/api/batches', { versionId: approvedId, madeOn: '2026-03-02', batchSize: 2000, operatorName: 'PV', deviation: 'Salt short by 0.2 kg, topped up from a new bag' });
      assert.equal(status, 201);
      assert.equal((body as BatchLogEntry).batchSize, 2000);
      const log = (await owner.call('GET', `/api/batches?versionId=${approvedId}`)).body as BatchLogEntry[];
      assert.equal(log[0].operatorName, 'PV');
      assert.equal(log[0].formulaName, 'Broiler starter');
      assert.match(log[0].deviation!, /Salt short/);
    });

    test('returns 400 with field errors for a missing operator and a malformed or future date; nothing is written', async () => {
      const before = (await app.database.db.select().from(batchLogs)).length;
      const bad = await operator.call('POST', '/api/batches', { versionId: approvedId, madeOn: '2/3/2026', batchSize: 1000, operatorName: ' ' });
      assert.equal(bad.status, 400);
      assert.ok(bad.body.error.fieldErrors.madeOn && bad.body.error.fieldErrors.operatorName);
      const future = await operator.call('POST', '/api/batches', { versionId: approvedId, madeOn: '2999-01-01', batchSize: 1000, operatorName: 'PV' });
      assert.equal(future.status, 400);
      assert.equal((await app.database.db.select().from(batchLogs)).length, before);
    });

    test('returns 404 for a draft version', async () => {
      assert.equal((await operator.call('POST', '/api/batches', { versionId: draftId, madeOn: '2026-03-02', batchSize: 1000, operatorName: 'PV' })).status, 404);
    });
  });

  describe('an archived formula', () => {
    test('leaves the operator’s approved list, while its batch sheet, CSV and log keep answering; restored, it is back', async () => {
      const nutritionist = await signInAsDemo(app.server.baseUrl, 'nutritionist@tamsby.example');
      const starter = ((await operator.call('GET', '/api/formulas/approved')).body as ApprovedFormula[]).find((a) => a.version.id === approvedId)!;
      assert.equal((await nutritionist.call('POST', `/api/formulas/${starter.formulaId}/archive`)).status, 200);
      try {
        assert.ok(!((await operator.call('GET', '/api/formulas/approved')).body as ApprovedFormula[]).some((a) => a.formulaId === starter.formulaId));
        const { status, body } = await operator.call('GET', `/api/batch-sheets/${approvedId}?batchSize=1000`);
        assert.equal(status, 200);
        assert.equal((body as BatchSheetResponse).formulaName, 'Broiler starter');
        assert.ok(Math.abs(sum((body as BatchSheetResponse).sheet.lines.map((l) => l.amount)) - 1000) <= 0.25 + 1e-9);
        const csv = await fetch(`${app.server.baseUrl}/api/batch-sheets/${approvedId}/csv`, { headers: { cookie: operator.cookie! } });
        assert.equal(csv.status, 200);
        const log = await owner.call('GET', `/api/batches?versionId=${approvedId}`);
        assert.equal(log.status, 200);
        assert.ok((log.body as BatchLogEntry[]).every((b) => b.formulaName === 'Broiler starter'));
      } finally {
        assert.equal((await nutritionist.call('POST', `/api/formulas/${starter.formulaId}/restore`)).status, 200);
      }
      assert.ok(((await operator.call('GET', '/api/formulas/approved')).body as ApprovedFormula[]).some((a) => a.version.id === approvedId));
    });
    test('a batch made on or before the archive day can still be logged; a later one is refused with who archived it and nothing is written', async () => {
      const nutritionist = await signInAsDemo(app.server.baseUrl, 'nutritionist@tamsby.example');
      const starter = ((await operator.call('GET', '/api/formulas/approved')).body as ApprovedFormula[]).find((a) => a.version.id === approvedId)!;
      const archived = await nutritionist.call('POST', `/api/formulas/${starter.formulaId}/archive`);
      assert.equal(archived.status, 200);
      try {
        const archiveDay = (archived.body as { archived: { at: string } }).archived.at.slice(0, 10);
        const dayAfter = new Date(Date.parse(`${archiveDay}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
        const before = (await app.database.db.select().from(batchLogs)).length;
        const late = await operator.call('POST', '/api/batches', { versionId: approvedId, madeOn: dayAfter, batchSize: 1000, operatorName: 'PV' });
        assert.equal(late.status, 409);
        assert.equal(late.body.error.code, 'archived');
        assert.match(late.body.error.message, new RegExp(`archived by .+ on ${archiveDay}.*restore`));
        assert.equal((await app.database.db.select().from(batchLogs)).length, before, 'nothing written');
        const onTheDay = await operator.call('POST', '/api/batches', { versionId: approvedId, madeOn: archiveDay, batchSize: 1000, operatorName: 'PV' });
        assert.equal(onTheDay.status, 201);
      } finally {
        assert.equal((await nutritionist.call('POST', `/api/formulas/${starter.formulaId}/restore`)).status, 200);
      }
    });
  });

  describe('US units', () => {
    test('the sheet and the log read in lb; the log keeps kg exactly (1 lb = 0.45359237 kg)', async () => {
      assert.equal((await owner.call('PUT', '/api/organization-settings', { unitSystem: 'us', currency: 'USD' })).status, 200);
      const { body } = await operator.call('GET', `/api/batch-sheets/${approvedId}?batchSize=4000&macroStep=1&minorStep=0.01`);
      const b = body as BatchSheetResponse;
      assert.equal(b.massUnit, 'lb');
      assert.ok(Math.abs(sum(b.sheet.lines.map((l) => l.amount)) - 4000) <= 0.5 + 1e-9);
      const made = await operator.call('POST', '/api/batches', { versionId: approvedId, madeOn: '2026-03-03', batchSize: 1000, operatorName: 'PV' });
      assert.equal(made.status, 201);
      const [row] = await app.database.db.select().from(batchLogs).where(eq(batchLogs.id, made.body.id));
      assert.ok(Math.abs(row.batchKg - 453.59237) < 1e-9, `${row.batchKg} kg`);
      assert.ok(Math.abs(made.body.batchSize - 1000) < 1e-6);
      await owner.call('PUT', '/api/organization-settings', { unitSystem: 'metric', currency: 'EUR' });
    });
  });
});
