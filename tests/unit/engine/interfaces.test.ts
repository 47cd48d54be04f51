/**
 * The command line and the Express router around the engine.
 */
import assert from 'node:assert/strict';
import { execFileSync, spawnSync } from 'node:child_process';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { after, before, describe, test } from 'node:test';

import express from 'express';

import '../../../server/http/access';
import { errorHandler } from '../../../server/http/error-handler';
import { formulationRouter } from '../../../server/routes/formulation';

const root = join(__dirname, '../../..');
const cli = (args: string[], input?: string) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'server/cli/formulate.ts', ...args], { cwd: root, input, encoding: 'utf8' });

describe('command line', () => {
  // Source: Taha, Operations Research: An Introduction, Ozark Farms diet problem (edition from memory).
  test('solves a problem file and prints JSON (Ozark Farms cost $437.65)', () => {
    const fixture = JSON.parse(execFileSync('node', ['-e', `process.stdout.write(JSON.stringify(require('./tests/fixtures/lp/taha-ozark-farms.json').problem))`], { cwd: root, encoding: 'utf8' }));
    const r = cli(['-'], JSON.stringify(fixture));
    assert.equal(r.status, 0, r.stderr);
    const out = JSON.parse(r.stdout);
    assert.equal(out.status, 'optimal');
    assert.ok(Math.abs(out.costPerBatch - 437.65) < 0.005);
  });
  test('bad input: exit 1 with the field named', () => {
    const r = cli(['-'], JSON.stringify({ batchKg: 0, ingredients: [] }));
    assert.equal(r.status, 1);
    assert.equal(JSON.parse(r.stdout).errors[0].field, 'batchKg');
  });
  test('infeasible: exit 2 with the relaxation', () => {
    const r = cli(['--compact', '-'], JSON.stringify({ batchKg: 100, ingredients: [{ id: 'a', pricePerKg: 1, nutrients: { cp: 9 } }], nutrients: [{ id: 'cp', min: 20 }] }));
    assert.equal(r.status, 2);
    assert.equal(JSON.parse(r.stdout).relaxations[0].constraint, 'nutrients[cp].min');
  });
});

describe('formulation router', () => {
  let base = '';
  let close: () => void = () => {};
  before(async () => {
    const app = express();
    app.use(express.json({ limit: '5mb' }));
    // The routes sit behind the session middleware; here a signed-in nutritionist stands in for it.
    app.use((req, _res, next) => {
      req.auth = { user: { id: 'u1' }, session: { id: 's1' }, membership: { organizationId: 1, organizationName: 'Test mill', role: 'nutritionist' } } as unknown as NonNullable<typeof req.auth>;
      next();
    });
    app.use('/api', formulationRouter());
    app.use(errorHandler);
    await new Promise<void>((resolve) => {
      const server = app.listen(0, () => resolve());
      base = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api`;
      close = () => server.close();
    });
  });
  after(() => close());
  const post = async (path: string, body: unknown) => {
    const res = await fetch(base + path, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
    return { status: res.status, body: (await res.json()) as Record<string, any> };
  };
  const problem = {
    batchKg: 1000,
    ingredients: [
      { id: 'corn', pricePerKg: 0.25, nutrients: { cp: 8.9 } },
      { id: 'sbm', pricePerKg: 0.45, nutrients: { cp: 44.4 } },
    ],
    nutrients: [{ id: 'cp', unit: '%', min: 18 }],
  };

  test('POST /solve answers the optimum; infeasible is a 200 with a status', async () => {
    const ok = await post('/solve', problem);
    assert.equal(ok.status, 200);
    assert.equal(ok.body.status, 'optimal');
    const inf = await post('/solve', { ...problem, nutrients: [{ id: 'cp', min: 50 }] });
    assert.equal(inf.status, 200);
    assert.equal(inf.body.status, 'infeasible');
  });
  test('bad body: 400 invalid_input with the field path', async () => {
    const r = await post('/solve', { ...problem, ratios: [{ numerator: 'lys', denominator: 'cp', min: 0.05 }] });
    assert.equal(r.status, 400);
    assert.equal(r.body.error.code, 'invalid_input');
    assert.ok(r.body.error.fieldErrors['ratios[0].numerator']);
  });
  test('evaluate, allocate and price sweep answer', async () => {
    const ev = await post('/solve/evaluate', { ...problem, mix: [{ id: 'corn', kg: 743.7 }, { id: 'sbm', kg: 256.3 }] });
    assert.equal(ev.body.status, 'evaluated');
    const al = await post('/solve/allocate', { ingredients: problem.ingredients, formulas: [{ id: 'a', batchKg: 500, nutrients: problem.nutrients }] });
    assert.equal(al.body.status, 'optimal');
    const sw = await post('/solve/price-sweep', { problem, ingredient: 'sbm', fromPrice: 0.3, toPrice: 0.6, steps: 4 });
    assert.equal(sw.body.status, 'swept');
    assert.equal(sw.body.points.length, 4);
  });
});
