import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import { and, count, eq, isNull } from 'drizzle-orm';

import { formulas, formulaVersions, ingredients, shares, specifications } from '../../server/db/schema';
import type { FormulaDetail, FormulaPriceSweep, FormulaRemoval, FormulaSolve, FormulaSummary, VersionDetail } from '../../src/shared/schemas/formulas';
import type { ShareCreated } from '../../src/shared/schemas/shares';
import type { Client } from '../helpers/accounts';
import { organizationId, signInAsDemo, startDemoApp } from '../helpers/demo';
import type { TestApp } from '../helpers/app';

const close = (actual: number, expected: number, tol: number, what: string) => assert.ok(Math.abs(actual - expected) <= tol, `${what}: ${actual} is not within ${tol} of ${expected}`);

/**
 * The formula workspace over HTTP against the demo scenario (Tamsby Cooperative Feed Mill's library,
 * specifications and demo formulas). Bounds checked against NRC (1994) are the [V] rows of the broiler
 * table (domain reference §1).
 */
describe('formulas API', () => {
  let app: TestApp;
  let nutritionist: Client;
  let operator: Client;
  let outsider: Client;
  let advisor: Client;
  let farmer: Client;
  let millId: number;
  let farmId: number;
  let growerSpecId: number;
  const own: Record<string, number> = {};

  before(async () => {
    app = await startDemoApp('formulas_api');
    const db = app.database.db;
    const base = app.server.baseUrl;
    nutritionist = await signInAsDemo(base, 'nutritionist@tamsby.example');
    operator = await signInAsDemo(base, 'operator@tamsby.example');
    outsider = await signInAsDemo(base, 'farmer@orrinhollow.example');
    await outsider.call('PUT', '/api/auth/active-organization', { organizationId: await organizationId(db, 'Orrin Hollow Larvae Farm') });
    millId = await organizationId(db, 'Tamsby Cooperative Feed Mill');
    farmId = await organizationId(db, 'Orrin Hollow Larvae Farm');
    advisor = await signInAsDemo(base, 'advisor@upperwend.example');
    await advisor.call('PUT', '/api/auth/active-organization', { organizationId: millId });
    farmer = await signInAsDemo(base, 'worker@orrinhollow.example');
    const [refGrower] = await db.select().from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, 'nrc1994-broiler-grower')));
    growerSpecId = (await db.select().from(specifications).where(and(eq(specifications.organizationId, millId), eq(specifications.copiedFromId, refGrower.id))))[0].id;
    for (const code of ['maize', 'soybean-meal-48', 'soybean-oil', 'limestone', 'dicalcium-phosphate', 'salt', 'l-lysine-hcl', 'dl-methionine', 'l-threonine', 'bsf-full-fat-brewery', 'bsf-defatted', 'wheat']) {
      const [ref] = await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, code)));
      own[code] = (await db.select().from(ingredients).where(and(eq(ingredients.organizationId, millId), eq(ingredients.copiedFromId, ref.id))))[0].id;
    }
    const [offal] = await db.select().from(ingredients).where(and(eq(ingredients.organizationId, millId), eq(ingredients.name, 'Larvae meal, defatted (poultry processing offal)')));
    own.offal = offal.id;
    own.contractMeal = (await db.select().from(ingredients).where(and(eq(ingredients.organizationId, millId), eq(ingredients.name, 'Larvae meal, partially defatted (Orrin Hollow contract)'))))[0].id;
  });
  after(async () => app?.close());

  const growerBody = (over: Record<string, unknown> = {}) => ({
    name: 'Test broiler grower',
    specificationId: growerSpecId,
    batchKg: 1000,
    ingredients: ['maize', 'wheat', 'soybean-meal-48', 'soybean-oil', 'limestone', 'dicalcium-phosphate', 'salt', 'l-lysine-hcl', 'dl-methionine', 'l-threonine', 'contractMeal'].map((code) => ({ ingredientId: own[code] })),
    ...over,
  });
  const versionCount = async (formulaId: number) => (await app.database.db.select({ n: count() }).from(formulaVersions).where(eq(formulaVersions.formulaId, formulaId)))[0].n;

  describe('the demo scenario', () => {
    test('has formulas across species, one with black soldier fly meal in the mix, one infeasible, one approved', async () => {
      const { status, body } = await nutritionist.call('GET', '/api/formulas');
      assert.equal(status, 200);
      const list = body as FormulaDetail[];
      assert.ok(list.length >= 4);
      assert.ok(new Set(list.map((f) => f.species?.family)).size >= 2, 'poultry and pig formulas');
      // Exactly the one formula made infeasible on purpose (no fat on hand), so a newcomer sees each state once.
      assert.deepEqual(list.filter((f) => f.latestVersion?.status === 'infeasible').map((f) => f.name), ['Broiler finisher without added fat']);
      assert.ok(list.some((f) => f.approvedVersion), 'an approved version');
      let bsfInMix = false;
      for (const f of list) {
        if (!f.latestVersion) continue;
        const v = (await nutritionist.call('GET', `/api/formulas/${f.id}/versions/${f.latestVersion.id}`)).body as VersionDetail;
        const result = v.snapshot.result;
        if (result.status === 'optimal' && result.mix.some((m) => v.snapshot.ingredients.find((u) => String(u.ingredientId) === m.id)?.insectSpecies === 'hermetia_illucens' && m.percent > 0.5)) bsfInMix = true;
        if (result.status === 'infeasible') assert.ok(result.relaxations.length > 0 && result.relaxations.every((r) => r.message.length > 10), 'infeasible advice in words');
      }
      assert.ok(bsfInMix, 'black soldier fly larvae meal in some mix');
    });
  });

  describe('GET /api/formulas/choices', () => {
    test('offers the mill’s specifications and ingredients, marking the ones the insect rule keeps out', async () => {
      const { status, body } = await nutritionist.call('GET', `/api/formulas/choices?specificationId=${growerSpecId}`);
      assert.equal(status, 200);
      assert.ok(body.specifications.some((s: { id: number }) => s.id === growerSpecId));
      const offal = body.ingredients.find((i: { id: number }) => i.id === own.offal);
      assert.equal(offal.offered.allowed, false);
      assert.match(offal.offered.message, /cannot go into diets for Broiler chicken/);
      assert.equal(body.ingredients.find((i: { id: number }) => i.id === own.contractMeal).offered.allowed, true);
      assert.equal((await nutritionist.call('GET', '/api/formulas/choices?specificationId=999999')).status, 404);
    });
  });

  describe('POST /api/formulas', () => {
    test('fills the bounds from the broiler grower specification (NRC 1994, grower column)', async () => {
      const { status, body } = await nutritionist.call('POST', '/api/formulas', growerBody());
      assert.equal(status, 201, JSON.stringify(body));
      const f = body as FormulaDetail;
      const min = (id: string) => f.inputs.nutrients.find((b) => b.nutrientId === id)?.min;
      // NRC (1994) broiler requirements, 3–6 weeks, [V] in the domain reference §1.
      assert.equal(min('cp'), 20);
      assert.equal(min('lys'), 1.0);
      assert.equal(min('met'), 0.38);
      assert.equal(min('amen_poultry'), 3200);
      assert.equal(f.species?.name, 'Broiler chicken');
      assert.ok(f.inputs.groups.some((g) => g.insectSpecies === 'hermetia_illucens' && g.maxPct === 10), 'the 10 % black soldier fly cap');
      assert.equal(await versionCount(f.id), 0);
    });

    test('refuses a larvae meal reared on poultry offal for broilers, naming the rule, and saves nothing', async () => {
      const before = (await app.database.db.select({ n: count() }).from(formulas))[0].n;
      const { status, body } = await nutritionist.call('POST', '/api/formulas', growerBody({ ingredients: [{ ingredientId: own.maize }, { ingredientId: own.offal }] }));
      assert.equal(status, 400);
      assert.match(body.error.fieldErrors['ingredients[1].ingredientId'][0], /cannot go into diets for Broiler chicken/);
      assert.equal((await app.database.db.select({ n: count() }).from(formulas))[0].n, before);
    });

    test('answers 400 with field errors for a bad batch and a missing specification', async () => {
      const { status, body } = await nutritionist.call('POST', '/api/formulas', { ...growerBody(), batchKg: -5, specificationId: undefined });
      assert.equal(status, 400);
      assert.ok(body.error.fieldErrors.batchKg);
      assert.ok(body.error.fieldErrors.specificationId);
    });
  });

  describe('POST /api/formulas/:id/solve', () => {
    test('solves with today’s library prices, states the basis, and keeps nothing', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody())).body as FormulaDetail;
      const { status, body } = await nutritionist.call('POST', `/api/formulas/${f.id}/solve`, {});
      assert.equal(status, 200);
      const s = body as FormulaSolve;
      assert.equal(s.basis, 'as fed');
      assert.equal(s.result.status, 'optimal', JSON.stringify(s.result).slice(0, 400));
      if (s.result.status !== 'optimal') return;
      close(s.result.mix.reduce((sum, m) => sum + m.kg, 0), 1000, 1e-6, 'batch kg');
      for (const b of [['cp', 20], ['lys', 1.0], ['met', 0.38], ['amen_poultry', 3200]] as const) {
        const level = s.result.nutrients.find((n) => n.id === b[0])!.value;
        assert.ok(level >= b[1] - 1e-6, `${b[0]} ${level} meets its minimum ${b[1]}`);
      }
      const maize = s.ingredients.find((u) => u.ingredientId === own.maize)!;
      assert.equal(maize.priceSource, 'library');
      assert.equal(maize.pricePerKg, 0.229, 'the demo library price of 16 March');
      assert.ok(s.result.nutrients.some((n) => n.binding && n.readable?.text), 'binding bounds carry readable shadow prices');
      assert.ok(s.result.ranging.length > 0);
      assert.equal(await versionCount(f.id), 0);
    });

    test('an impossible bound in unsaved inputs answers 200 infeasible with advice, and the saved inputs stay', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody())).body as FormulaDetail;
      const inputs = { ...f.inputs, nutrients: f.inputs.nutrients.map((b) => (b.nutrientId === 'amen_poultry' ? { ...b, min: 9000 } : b)) };
      const { status, body } = await nutritionist.call('POST', `/api/formulas/${f.id}/solve`, { inputs });
      assert.equal(status, 200);
      assert.equal(body.result.status, 'infeasible');
      assert.ok(body.result.relaxations.some((r: { message: string }) => /AMEn/.test(r.message)), JSON.stringify(body.result.relaxations));
      const again = (await nutritionist.call('GET', `/api/formulas/${f.id}`)).body as FormulaDetail;
      assert.equal(again.inputs.nutrients.find((b) => b.nutrientId === 'cp')?.min, 20);
    });
  });

  describe('versions', () => {
    test('a kept version is a snapshot: a later library price change does not touch it', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody())).body as FormulaDetail;
      const kept = await nutritionist.call('POST', `/api/formulas/${f.id}/versions`, { note: 'First try' });
      assert.equal(kept.status, 201);
      const v = kept.body as VersionDetail;
      assert.equal(v.number, 1);
      assert.equal(v.createdBy, 'Idris Okonjo');
      assert.equal(v.approval, 'not_approved');
      const soyBefore = v.snapshot.ingredients.find((u) => u.ingredientId === own['soybean-meal-48'])!;
      await app.database.db.update(ingredients).set({ pricePerKg: '0.9000', version: 99 }).where(eq(ingredients.id, own['soybean-meal-48']));
      const later = (await nutritionist.call('GET', `/api/formulas/${f.id}/versions/${v.id}`)).body as VersionDetail;
      assert.deepEqual(later.snapshot, v.snapshot);
      assert.equal(later.snapshot.ingredients.find((u) => u.ingredientId === own['soybean-meal-48'])!.pricePerKg, soyBefore.pricePerKg);
      const fresh = (await nutritionist.call('POST', `/api/formulas/${f.id}/solve`, {})).body as FormulaSolve;
      assert.equal(fresh.ingredients.find((u) => u.ingredientId === own['soybean-meal-48'])!.pricePerKg, 0.9);
      await app.database.db.update(ingredients).set({ pricePerKg: soyBefore.libraryPricePerKg!.toFixed(4) }).where(eq(ingredients.id, own['soybean-meal-48']));
    });

    test('an infeasible version cannot be approved; a newer approval supersedes the older', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody())).body as FormulaDetail;
      const bad = { ...f.inputs, nutrients: f.inputs.nutrients.map((b) => (b.nutrientId === 'amen_poultry' ? { ...b, min: 9000 } : b)) };
      const v1 = (await nutritionist.call('POST', `/api/formulas/${f.id}/versions`, { inputs: bad })).body as VersionDetail;
      assert.equal(v1.status, 'infeasible');
      const refused = await nutritionist.call('POST', `/api/formulas/${f.id}/versions/${v1.id}/approve`);
      assert.equal(refused.status, 409);
      assert.match(refused.body.error.message, /cannot be approved/);
      const v2 = (await nutritionist.call('POST', `/api/formulas/${f.id}/versions`, { inputs: f.inputs })).body as VersionDetail;
      const v3 = (await nutritionist.call('POST', `/api/formulas/${f.id}/versions`, { inputs: f.inputs, note: 'same again' })).body as VersionDetail;
      assert.equal((await nutritionist.call('POST', `/api/formulas/${f.id}/versions/${v2.id}/approve`)).body.approval, 'current');
      assert.equal((await nutritionist.call('POST', `/api/formulas/${f.id}/versions/${v2.id}/approve`)).status, 409, 'approving twice is refused');
      assert.equal((await nutritionist.call('POST', `/api/formulas/${f.id}/versions/${v3.id}/approve`)).body.approval, 'current');
      const versions = (await nutritionist.call('GET', `/api/formulas/${f.id}/versions`)).body as VersionDetail[];
      assert.deepEqual(versions.map((v) => [v.number, v.approval]), [[3, 'current'], [2, 'superseded'], [1, 'not_approved']]);
      // Immutable: the approval columns are the only ones written after the insert.
      const rows = await app.database.db.select().from(formulaVersions).where(eq(formulaVersions.id, v2.id));
      assert.deepEqual(rows[0].snapshot, v2.snapshot);

      // The mill operator sees the current approved version only, and nothing else of formulas.
      const approved = (await operator.call('GET', '/api/formulas/approved')).body as { formulaId: number; version: { id: number } }[];
      assert.equal(approved.find((a) => a.formulaId === f.id)?.version.id, v3.id);
      assert.equal((await operator.call('GET', `/api/formulas/approved/${v3.id}`)).status, 200);
      assert.equal((await operator.call('GET', `/api/formulas/approved/${v2.id}`)).status, 404, 'a superseded version does not reach the mill');
      assert.equal((await operator.call('GET', `/api/formulas/approved/${v1.id}`)).status, 404);
      assert.equal((await operator.call('GET', `/api/formulas/${f.id}`)).status, 403);
      assert.equal((await operator.call('GET', `/api/formulas/${f.id}/versions/${v3.id}`)).status, 403);
      assert.equal((await outsider.call('GET', `/api/formulas/approved/${v3.id}`)).status, 404);
    });

    test('compare gives b minus a for cost per tonne, mix and nutrient levels', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody())).body as FormulaDetail;
      const a = (await nutritionist.call('POST', `/api/formulas/${f.id}/versions`, {})).body as VersionDetail;
      const dearSoy = { ...f.inputs, ingredients: f.inputs.ingredients.map((i) => (i.ingredientId === own['soybean-meal-48'] ? { ...i, pricePerKg: 0.75 } : i)) };
      const b = (await nutritionist.call('POST', `/api/formulas/${f.id}/versions`, { inputs: dearSoy })).body as VersionDetail;
      const { status, body } = await nutritionist.call('GET', `/api/formulas/${f.id}/compare?a=${a.id}&b=${b.id}`);
      assert.equal(status, 200);
      assert.ok(a.costPerTonne !== null && b.costPerTonne !== null);
      close(body.cost.diffPerTonne, b.costPerTonne! - a.costPerTonne!, 1e-9, 'cost difference');
      assert.ok(body.cost.diffPerTonne > 0, 'dearer soybean meal raises the cost');
      for (const line of body.mix) close(line.diffPercent, line.bPercent - line.aPercent, 1e-9, line.name);
    });
  });

  describe('PUT /api/formulas/:id', () => {
    test('a stale revision answers 409 and nothing is overwritten', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody())).body as FormulaDetail;
      const first = await nutritionist.call('PUT', `/api/formulas/${f.id}`, { inputs: { ...f.inputs, batchKg: 3000 }, expectedRevision: f.revision });
      assert.equal(first.status, 200);
      const stale = await nutritionist.call('PUT', `/api/formulas/${f.id}`, { inputs: { ...f.inputs, batchKg: 500 }, expectedRevision: f.revision });
      assert.equal(stale.status, 409);
      assert.equal(((await nutritionist.call('GET', `/api/formulas/${f.id}`)).body as FormulaDetail).inputs.batchKg, 3000);
    });
  });

  describe('POST /api/formulas/:id/price-sweep', () => {
    test('finds the price at which the larvae meal enters, and cost never falls as its price rises', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody())).body as FormulaDetail;
      const { status, body } = await nutritionist.call('POST', `/api/formulas/${f.id}/price-sweep`, { ingredientId: own.contractMeal, fromPrice: 0, toPrice: 1.5, steps: 31 });
      assert.equal(status, 200, JSON.stringify(body));
      const sweep = (body as FormulaPriceSweep).sweep;
      assert.equal(sweep.points.length, 31);
      assert.equal(sweep.entry.kind, 'enters_in_range', JSON.stringify(sweep.entry));
      const entersAt = sweep.entry.kind === 'enters_in_range' ? sweep.entry.price : NaN;
      assert.ok(entersAt > 0 && entersAt < 1.5, `enters at ${entersAt}`);
      for (let i = 1; i < sweep.points.length; i++) {
        const [p, q] = [sweep.points[i - 1], sweep.points[i]];
        assert.ok(q.costPerBatch! >= p.costPerBatch! - 1e-6, `cost at ${q.pricePerKg} below cost at ${p.pricePerKg}`);
        assert.ok(q.kg! <= p.kg! + 1e-6, 'inclusion never grows as the price rises');
      }
      const above = sweep.points.filter((p) => p.pricePerKg > entersAt + 1e-6);
      assert.ok(above.length > 0 && above.every((p) => p.kg! < 1e-6), 'left out above its entering price');
      assert.ok(sweep.points.filter((p) => p.pricePerKg < entersAt - 1e-6).every((p) => p.kg! > 1e-3), 'used below it');
      // Today's price is the library's; the point solved there matches a plain solve.
      const today = (await nutritionist.call('POST', `/api/formulas/${f.id}/solve`, {})).body as FormulaSolve;
      const used = today.result.status === 'optimal' ? (today.result.mix.find((m) => m.id === String(own.contractMeal))?.kg ?? 0) : NaN;
      close(sweep.current.kg!, used, 1e-6, 'kg at today’s price');
      // Cap from Dabbou et al. 2018: at most 10 % of the feed, 100 kg in a 1,000 kg batch.
      assert.ok(sweep.points.every((p) => p.kg! <= 100 + 1e-6));
    });

    test('a minimum inclusion is told apart from "never enters": always in, at its minimum when dear', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody())).body as FormulaDetail;
      const inputs = { ...f.inputs, ingredients: f.inputs.ingredients.map((i) => (i.ingredientId === own.contractMeal ? { ...i, minPct: 2 } : i)) };
      const { status, body } = await nutritionist.call('POST', `/api/formulas/${f.id}/price-sweep`, { ingredientId: own.contractMeal, fromPrice: 0, toPrice: 1.5, steps: 7, inputs });
      assert.equal(status, 200, JSON.stringify(body));
      const { entry, points } = (body as FormulaPriceSweep).sweep;
      assert.equal(entry.kind, 'always_in', JSON.stringify(entry));
      if (entry.kind !== 'always_in') return;
      assert.equal(entry.reason, 'minimum');
      close(entry.leastKg, 20, 1e-6, '2 % of 1,000 kg');
      assert.ok(points.every((p) => p.kg! >= 20 - 1e-6));
      // The meal is also capped out at 0 %: then nothing keeps it in and it is left out at any price.
      const capped = { ...f.inputs, ingredients: f.inputs.ingredients.map((i) => (i.ingredientId === own.contractMeal ? { ...i, maxPct: 0 } : i)) };
      const out = (await nutritionist.call('POST', `/api/formulas/${f.id}/price-sweep`, { ingredientId: own.contractMeal, steps: 3, inputs: capped })).body as FormulaPriceSweep;
      assert.deepEqual(out.sweep.entry, { kind: 'never_in_range', entersAtPrice: null });
    });

    test('an ingredient that is not in the formula is refused with what to do', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody({ ingredients: [{ ingredientId: own.maize }, { ingredientId: own['soybean-meal-48'] }] }))).body as FormulaDetail;
      const { status, body } = await nutritionist.call('POST', `/api/formulas/${f.id}/price-sweep`, { ingredientId: own['bsf-full-fat-brewery'] });
      assert.equal(status, 400);
      assert.match(body.error.fieldErrors.ingredientId[0], /add this ingredient/);
    });
  });

  describe('DELETE /api/formulas/:id', () => {
    const rowsOf = async (formulaId: number) => ({
      formulas: (await app.database.db.select({ n: count() }).from(formulas).where(eq(formulas.id, formulaId)))[0].n,
      versions: await versionCount(formulaId),
    });

    test('a formula never approved goes with its kept versions, in one go; its removal says so before', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody({ name: 'Trial grower to drop' }))).body as FormulaDetail;
      const bad = { ...f.inputs, nutrients: f.inputs.nutrients.map((b) => (b.nutrientId === 'amen_poultry' ? { ...b, min: 9000 } : b)) };
      assert.equal((await nutritionist.call('POST', `/api/formulas/${f.id}/versions`, {})).status, 201);
      assert.equal((await nutritionist.call('POST', `/api/formulas/${f.id}/versions`, { inputs: bad })).status, 201);
      const preview = await nutritionist.call('GET', `/api/formulas/${f.id}/removal`);
      assert.equal(preview.status, 200);
      const removal = preview.body as FormulaRemoval;
      assert.equal(removal.removable, true);
      assert.equal(removal.versionCount, 2);
      assert.deepEqual(removal.holds, { approvedVersions: [], batches: { count: 0, lastMadeOn: null }, shares: [] });
      assert.equal(removal.message, 'Deleting “Trial grower to drop” removes it for good with its current inputs and its 2 kept versions (none approved, none shared, no batch recorded). This cannot be undone.');
      assert.deepEqual(await rowsOf(f.id), { formulas: 1, versions: 2 }, 'the preview changes nothing');

      const { status } = await nutritionist.call('DELETE', `/api/formulas/${f.id}`);
      assert.equal(status, 204);
      assert.deepEqual(await rowsOf(f.id), { formulas: 0, versions: 0 });
      assert.equal((await nutritionist.call('GET', `/api/formulas/${f.id}`)).status, 404);
      assert.ok(!((await nutritionist.call('GET', '/api/formulas')).body as FormulaSummary[]).some((x) => x.id === f.id), 'gone from the list');
      assert.equal((await nutritionist.call('DELETE', `/api/formulas/${f.id}`)).status, 404, 'a second delete finds nothing');
    });

    test('an approved formula with a batch recorded is refused, naming both; nothing changes and the mill keeps its batch sheet and log', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody({ name: 'Grower in use' }))).body as FormulaDetail;
      const v = (await nutritionist.call('POST', `/api/formulas/${f.id}/versions`, {})).body as VersionDetail;
      assert.equal((await nutritionist.call('POST', `/api/formulas/${f.id}/versions/${v.id}/approve`)).status, 200);
      const batch = await operator.call('POST', '/api/batches', { versionId: v.id, madeOn: '2026-03-20', batchSize: 1000, operatorName: 'T. Ferro' });
      assert.equal(batch.status, 201, JSON.stringify(batch.body));

      const removal = (await nutritionist.call('GET', `/api/formulas/${f.id}/removal`)).body as FormulaRemoval;
      assert.equal(removal.removable, false);
      assert.deepEqual(removal.holds.approvedVersions.map((x) => [x.number, x.current, x.approvedBy]), [[1, true, 'Idris Okonjo']]);
      assert.deepEqual(removal.holds.batches, { count: 1, lastMadeOn: '2026-03-20' });

      const { status, body } = await nutritionist.call('DELETE', `/api/formulas/${f.id}`);
      assert.equal(status, 409);
      assert.equal(body.error.code, 'in_use');
      assert.match(body.error.message, /^“Grower in use” cannot be deleted: version 1 is the approved version the mill makes batches from \(approved by Idris Okonjo on \d{4}-\d{2}-\d{2}\) and 1 batch was recorded from it at the mill \(the last made on 2026-03-20\)\./);
      assert.equal(body.error.message, removal.message);
      assert.match(body.error.fieldErrors.approvedVersions[0], /^Version 1, approved by Idris Okonjo on .* \(the mill uses it\)$/);
      assert.deepEqual(body.error.fieldErrors.batches, ['1 batch recorded, the last made on 2026-03-20']);
      // Nothing was touched: the formula, its version, the mill's batch sheet and the log all still answer.
      assert.deepEqual(await rowsOf(f.id), { formulas: 1, versions: 1 });
      assert.equal((await operator.call('GET', `/api/batch-sheets/${v.id}`)).status, 200);
      const log = (await operator.call('GET', `/api/batches?versionId=${v.id}`)).body as { formulaId: number; formulaName: string }[];
      assert.deepEqual(log.map((b) => [b.formulaId, b.formulaName]), [[f.id, 'Grower in use']]);
      // Nor can the advisor: what holds it holds it for every role.
      assert.equal((await advisor.call('DELETE', `/api/formulas/${f.id}`)).status, 409);
    });

    test('a version shared with a farm holds the formula even unapproved; the farm’s link keeps working', async () => {
      const f = (await advisor.call('POST', '/api/formulas', growerBody({ name: 'Grower shared with the farm' }))).body as FormulaDetail;
      const v = (await advisor.call('POST', `/api/formulas/${f.id}/versions`, {})).body as VersionDetail;
      const shared = await advisor.call('POST', '/api/shares', { kind: 'formula_version', formulaId: f.id, versionId: v.id, toOrganizationId: farmId });
      assert.equal(shared.status, 201, JSON.stringify(shared.body));
      const { status, body } = await advisor.call('DELETE', `/api/formulas/${f.id}`);
      assert.equal(status, 409);
      assert.match(body.error.message, /a version of it was shared with Orrin Hollow Larvae Farm/);
      assert.match(body.error.fieldErrors.shares[0], /^Version 1 shared with Orrin Hollow Larvae Farm on \d{4}-\d{2}-\d{2}$/);
      assert.equal(body.error.fieldErrors.approvedVersions, undefined, 'it was never approved');
      assert.deepEqual(await rowsOf(f.id), { formulas: 1, versions: 1 });
      assert.equal((await farmer.call('GET', `/api/shares/${(shared.body as ShareCreated).token}`)).status, 200);
      // Shares of another formula do not hold this one.
      const other = (await advisor.call('POST', '/api/formulas', growerBody({ name: 'Unshared twin' }))).body as FormulaDetail;
      await advisor.call('POST', `/api/formulas/${other.id}/versions`, {});
      assert.equal(((await advisor.call('GET', `/api/formulas/${other.id}/removal`)).body as FormulaRemoval).removable, true);
      assert.ok((await app.database.db.select({ n: count() }).from(shares))[0].n >= 1);
    });

    test('another organization’s formula answers 404 to its removal and to a delete, and stays', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody({ name: 'Not theirs' }))).body as FormulaDetail;
      assert.equal((await outsider.call('GET', `/api/formulas/${f.id}/removal`)).status, 404);
      assert.equal((await outsider.call('DELETE', `/api/formulas/${f.id}`)).status, 404);
      assert.equal((await operator.call('DELETE', `/api/formulas/${f.id}`)).status, 403, 'a mill operator may not remove formulas');
      assert.deepEqual(await rowsOf(f.id), { formulas: 1, versions: 0 });
    });
  });

  describe('archiving and restoring', () => {
    test('a held formula is archived instead: out of both lists, read-only, while its sheet, log and the farm’s link keep working; restoring brings it back', async () => {
      // Approved, a batch made from it, a version shared with the farm: every kind of hold at once.
      const f = (await advisor.call('POST', '/api/formulas', growerBody({ name: 'Grower to archive' }))).body as FormulaDetail;
      const v1 = (await advisor.call('POST', `/api/formulas/${f.id}/versions`, {})).body as VersionDetail;
      const v2 = (await advisor.call('POST', `/api/formulas/${f.id}/versions`, { note: 'not approved yet' })).body as VersionDetail;
      assert.equal((await nutritionist.call('POST', `/api/formulas/${f.id}/versions/${v1.id}/approve`)).status, 200);
      assert.equal((await operator.call('POST', '/api/batches', { versionId: v1.id, madeOn: '2026-03-21', batchSize: 1000, operatorName: 'T. Ferro' })).status, 201);
      const shared = await advisor.call('POST', '/api/shares', { kind: 'formula_version', formulaId: f.id, versionId: v1.id, toOrganizationId: farmId });
      assert.equal(shared.status, 201, JSON.stringify(shared.body));
      const token = (shared.body as ShareCreated).token;

      const removal = (await nutritionist.call('GET', `/api/formulas/${f.id}/removal`)).body as FormulaRemoval;
      assert.equal(removal.removable, false);
      assert.equal(removal.archiveInstead?.message, 'Archive “Grower to archive” instead: it leaves the formula list and the mill’s list of approved formulas and becomes read-only, while batch sheets, the batch log and shared links keep working. It can be restored at any time.');

      // Only owners and nutritionists decide what leaves the mill's view.
      assert.equal((await advisor.call('POST', `/api/formulas/${f.id}/archive`)).status, 403);
      assert.equal((await operator.call('POST', `/api/formulas/${f.id}/archive`)).status, 403);
      const archived = await nutritionist.call('POST', `/api/formulas/${f.id}/archive`);
      assert.equal(archived.status, 200, JSON.stringify(archived.body));
      assert.equal((archived.body as FormulaDetail).archived?.by, 'Idris Okonjo');
      const again = await nutritionist.call('POST', `/api/formulas/${f.id}/archive`);
      assert.equal(again.status, 409);
      assert.equal(again.body.error.code, 'already_archived');
      assert.match(again.body.error.message, /^“Grower to archive” was already archived by Idris Okonjo on \d{4}-\d{2}-\d{2}\. Nothing changed\.$/);
      assert.equal(((await nutritionist.call('GET', `/api/formulas/${f.id}/removal`)).body as FormulaRemoval).archiveInstead, null, 'archived already: nothing more to offer');

      // Out of the working list, in the archived one; still readable with its versions.
      const inUse = (await nutritionist.call('GET', '/api/formulas')).body as FormulaSummary[];
      assert.ok(!inUse.some((x) => x.id === f.id));
      assert.ok(inUse.every((x) => x.archived === null));
      const shelf = (await nutritionist.call('GET', '/api/formulas?archived=true')).body as FormulaSummary[];
      assert.deepEqual(shelf.map((x) => [x.id, x.archived?.by]), [[f.id, 'Idris Okonjo']]);
      const detail = await nutritionist.call('GET', `/api/formulas/${f.id}`);
      assert.equal(detail.status, 200);
      assert.ok((detail.body as FormulaDetail).archived);
      assert.equal((await nutritionist.call('GET', `/api/formulas/${f.id}/versions/${v1.id}`)).status, 200);
      assert.equal((await nutritionist.call('GET', `/api/formulas/${f.id}/compare?a=${v1.id}&b=${v2.id}`)).status, 200);

      // Read-only: every change, solve, keep and approval is refused and nothing is written.
      const refusals = [
        await nutritionist.call('PUT', `/api/formulas/${f.id}`, { inputs: { ...f.inputs, batchKg: 2500 } }),
        await nutritionist.call('POST', `/api/formulas/${f.id}/solve`, {}),
        await nutritionist.call('POST', `/api/formulas/${f.id}/versions`, {}),
        await nutritionist.call('POST', `/api/formulas/${f.id}/versions/${v2.id}/approve`),
        await nutritionist.call('POST', `/api/formulas/${f.id}/price-sweep`, { ingredientId: own.contractMeal, steps: 3 }),
      ];
      for (const r of refusals) {
        assert.equal(r.status, 409, JSON.stringify(r.body));
        assert.equal(r.body.error.code, 'archived');
        assert.match(r.body.error.message, /^archived: restore it first\. “Grower to archive” was archived by Idris Okonjo on /);
      }
      const [row] = await app.database.db.select().from(formulas).where(eq(formulas.id, f.id));
      assert.equal(row.inputs.batchKg, 1000);
      assert.equal(row.revision, f.revision, 'no change was saved');
      assert.equal(await versionCount(f.id), 2);
      assert.equal(((await nutritionist.call('GET', `/api/formulas/${f.id}/versions`)).body as VersionDetail[]).find((v) => v.id === v2.id)?.approval, 'not_approved');

      // The mill's approved list drops it; what was handed out keeps answering.
      assert.ok(!((await operator.call('GET', '/api/formulas/approved')).body as { formulaId: number }[]).some((a) => a.formulaId === f.id));
      assert.ok(!((await nutritionist.call('GET', '/api/formulas/approved')).body as { formulaId: number }[]).some((a) => a.formulaId === f.id), 'planners see the same mill list');
      assert.equal((await operator.call('GET', `/api/formulas/approved/${v1.id}`)).status, 200);
      assert.equal((await operator.call('GET', `/api/batch-sheets/${v1.id}`)).status, 200);
      const csv = await fetch(`${app.server.baseUrl}/api/batch-sheets/${v1.id}/csv`, { headers: { cookie: operator.cookie! } });
      assert.equal(csv.status, 200);
      const log = (await operator.call('GET', `/api/batches?versionId=${v1.id}`)).body as { formulaName: string; madeOn: string }[];
      assert.deepEqual(log.map((b) => [b.formulaName, b.madeOn]), [['Grower to archive', '2026-03-21']]);
      assert.equal((await farmer.call('GET', `/api/shares/${token}`)).status, 200);
      assert.ok(((await farmer.call('GET', '/api/shares')).body as { token: string }[]).some((x) => x.token === token), 'the farm keeps it in its list');

      // Restoring: back in both lists and editable again; restoring twice is refused.
      assert.equal((await advisor.call('POST', `/api/formulas/${f.id}/restore`)).status, 403);
      const restored = await nutritionist.call('POST', `/api/formulas/${f.id}/restore`);
      assert.equal(restored.status, 200);
      assert.equal((restored.body as FormulaDetail).archived, null);
      const twice = await nutritionist.call('POST', `/api/formulas/${f.id}/restore`);
      assert.equal(twice.status, 409);
      assert.equal(twice.body.error.code, 'not_archived');
      assert.ok(((await nutritionist.call('GET', '/api/formulas')).body as FormulaSummary[]).some((x) => x.id === f.id));
      assert.ok(!((await nutritionist.call('GET', '/api/formulas?archived=true')).body as FormulaSummary[]).some((x) => x.id === f.id));
      assert.equal(((await operator.call('GET', '/api/formulas/approved')).body as { formulaId: number; version: { id: number } }[]).find((a) => a.formulaId === f.id)?.version.id, v1.id);
      assert.equal((await nutritionist.call('PUT', `/api/formulas/${f.id}`, { inputs: { ...f.inputs, batchKg: 2500 } })).status, 200);
    });

    test('another organization’s formula answers 404 to archive and restore; a bad list filter answers 400', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody({ name: 'Not theirs to archive' }))).body as FormulaDetail;
      const [outsiderOwn] = ((await outsider.call('GET', '/api/formulas')).body as FormulaSummary[]).filter((x) => x.id === f.id);
      assert.equal(outsiderOwn, undefined);
      assert.equal((await outsider.call('POST', `/api/formulas/${f.id}/archive`)).status, 404);
      assert.equal((await nutritionist.call('POST', `/api/formulas/${f.id}/archive`)).status, 200);
      assert.equal((await outsider.call('POST', `/api/formulas/${f.id}/restore`)).status, 404);
      assert.ok(!((await outsider.call('GET', '/api/formulas?archived=true')).body as FormulaSummary[]).some((x) => x.id === f.id));
      const [row] = await app.database.db.select().from(formulas).where(eq(formulas.id, f.id));
      assert.ok(row.archivedAt, 'still archived: the outsider changed nothing');
      const bad = await nutritionist.call('GET', '/api/formulas?archived=maybe');
      assert.equal(bad.status, 400);
      assert.ok(bad.body.error.fieldErrors.archived);
      // A never-approved draft can be archived too, and still deleted (nothing holds it).
      assert.equal(((await nutritionist.call('GET', `/api/formulas/${f.id}/removal`)).body as FormulaRemoval).removable, true);
      assert.equal((await nutritionist.call('DELETE', `/api/formulas/${f.id}`)).status, 204);
    });
  });

  describe('saving a formula while one of its ingredients is deleted', () => {
    test('one of the two wins cleanly, round after round: never a formula naming a deleted ingredient', async () => {
      const db = app.database.db;
      const base = (await nutritionist.call('POST', '/api/formulas', growerBody({ name: 'Race grower' }))).body as FormulaDetail;
      const outcomes = { saved: 0, deleted: 0 };
      for (let round = 0; round < 20; round++) {
        const made = await nutritionist.call('POST', '/api/ingredients', { name: `Race barley ${round}`, category: 'cereal_grain', pricePerKg: 0.2 });
        assert.equal(made.status, 201, JSON.stringify(made.body));
        const ingredientId = (made.body as { id: number }).id;
        const withIt = [...base.inputs.ingredients, { ingredientId }];
        // Even rounds edit a formula (PUT), odd rounds create one (POST); the two requests start together, in turn first.
        const save = () =>
          round % 2 === 0
            ? nutritionist.call('PUT', `/api/formulas/${base.id}`, { inputs: { ...base.inputs, ingredients: withIt } })
            : nutritionist.call('POST', '/api/formulas', growerBody({ name: `Race formula ${round}`, ingredients: withIt.map(({ ingredientId: id }) => ({ ingredientId: id })) }));
        const remove = () => nutritionist.call('DELETE', `/api/ingredients/${ingredientId}`);
        const [saved, deleted] = round % 4 < 2 ? await Promise.all([save(), remove()]) : await (async () => {
          const d = remove();
          const s = save();
          return [await s, await d];
        })();
        const exists = (await db.select({ n: count() }).from(ingredients).where(eq(ingredients.id, ingredientId)))[0].n === 1;
        if (saved.status === 200 || saved.status === 201) {
          outcomes.saved++;
          assert.equal(deleted.status, 409, `round ${round}: the save won, so the delete must be refused: ${JSON.stringify(deleted.body)}`);
          assert.match(deleted.body.error.message, /was not deleted: it is used in the formula/);
          assert.ok(exists, `round ${round}: the ingredient is still in the library`);
        } else {
          outcomes.deleted++;
          assert.equal(deleted.status, 204, `round ${round}: neither request succeeded (save ${saved.status}, delete ${deleted.status})`);
          assert.equal(saved.status, 400, `round ${round}: ${JSON.stringify(saved.body)}`);
          assert.match(JSON.stringify(saved.body.error.fieldErrors), new RegExp(`no ingredient with id ${ingredientId} in your library`));
          assert.ok(!exists);
        }
      }
      // The invariant over the whole mill: every ingredient any formula names is in the library.
      const rows = await db.select({ name: formulas.name, inputs: formulas.inputs }).from(formulas).where(eq(formulas.organizationId, millId));
      const ids = new Set((await db.select({ id: ingredients.id }).from(ingredients)).map((r) => r.id));
      for (const f of rows) for (const i of f.inputs.ingredients) assert.ok(ids.has(i.ingredientId), `${f.name} names ingredient ${i.ingredientId}, which is gone`);
      assert.equal(outcomes.saved + outcomes.deleted, 20);
    });

    test('keeping a version with new inputs refuses an ingredient deleted since, and keeps nothing', async () => {
      const f = (await nutritionist.call('POST', '/api/formulas', growerBody({ name: 'Keep after delete' }))).body as FormulaDetail;
      const made = (await nutritionist.call('POST', '/api/ingredients', { name: 'Barley kept too late', category: 'cereal_grain', pricePerKg: 0.2 })).body as { id: number };
      assert.equal((await nutritionist.call('DELETE', `/api/ingredients/${made.id}`)).status, 204);
      const { status, body } = await nutritionist.call('POST', `/api/formulas/${f.id}/versions`, { inputs: { ...f.inputs, ingredients: [...f.inputs.ingredients, { ingredientId: made.id }] } });
      assert.equal(status, 400);
      assert.match(JSON.stringify(body.error.fieldErrors), /no ingredient with id \d+ in your library/);
      assert.equal(await versionCount(f.id), 0);
    });
  });

  test('another organization’s formula answers 404', async () => {
    const [f] = await app.database.db.select().from(formulas).where(eq(formulas.organizationId, millId));
    assert.equal((await outsider.call('GET', `/api/formulas/${f.id}`)).status, 404);
  });
});
