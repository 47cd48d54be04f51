import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import { and, count, eq, isNull } from 'drizzle-orm';

import { ingredientNutrientValues, ingredientPrices, ingredients, ingredientValueSets, labImportAnalyses, species, specifications } from '../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { createOrganization, createUser, signedInClient, type Client } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';

describe('library API', () => {
  let app: TestApp;
  let nutritionist: Client;
  let advisor: Client;
  let outsider: Client;
  const ref: Record<string, number> = {};

  before(async () => {
    app = await startTestApp('library_api');
    const db = app.database.db;
    await seedDemoData(db, [REFERENCE_LIBRARY_STEP]);
    const orgA = await createOrganization(db, 'Library Test Mill');
    const orgB = await createOrganization(db, 'Library Test Farm', 'farm');
    await createUser(db, { email: 'nutri@lib.example.org', organizationId: orgA.id, role: 'nutritionist' });
    await createUser(db, { email: 'advisor@lib.example.org', organizationId: orgA.id, role: 'advisor' });
    await createUser(db, { email: 'owner@other.example.org', organizationId: orgB.id, role: 'owner' });
    nutritionist = await signedInClient(app.server.baseUrl, 'nutri@lib.example.org');
    advisor = await signedInClient(app.server.baseUrl, 'advisor@lib.example.org');
    outsider = await signedInClient(app.server.baseUrl, 'owner@other.example.org');
    for (const code of ['maize', 'soybean-meal-48']) {
      ref[code] = (await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, code))))[0].id;
    }
    for (const code of ['broiler', 'grow-finish-pig']) ref[code] = (await db.select().from(species).where(eq(species.code, code)))[0].id;
    ref.starter = (await db.select().from(specifications).where(eq(specifications.code, 'nrc1994-broiler-starter')))[0].id;
  });
  after(async () => app?.close());

  const countRows = async (table: typeof ingredients | typeof ingredientPrices) => (await app.database.db.select({ n: count() }).from(table))[0].n;

  describe('GET /api/nutrients', () => {
    test('filters by family: pig lists carry SID amino acids and NE, never poultry AMEn', async () => {
      const { status, body } = await nutritionist.call('GET', '/api/nutrients?family=swine');
      assert.equal(status, 200);
      const ids = body.items.map((n: { id: string }) => n.id);
      assert.ok(ids.includes('sid_lys') && ids.includes('ne_swine'));
      assert.ok(!ids.includes('amen_poultry') && !ids.includes('dig_lys'));
    });
  });

  describe('GET /api/ingredients', () => {
    test('searches and pages the reference library', async () => {
      const { status, body } = await nutritionist.call('GET', '/api/ingredients?library=reference&search=soybean&pageSize=2&page=1');
      assert.equal(status, 200);
      assert.equal(body.total, 4, 'soybean meal 44 and 48, full-fat soybean, soybean oil');
      assert.equal(body.items.length, 2);
      const second = await nutritionist.call('GET', '/api/ingredients?library=reference&search=soybean&pageSize=2&page=2');
      assert.equal(second.body.items.length, 2);
      assert.notEqual(second.body.items[0].id, body.items[0].id);
    });

    test('answers 400 naming the field for a bad page size', async () => {
      const { status, body } = await nutritionist.call('GET', '/api/ingredients?pageSize=5000');
      assert.equal(status, 400);
      assert.ok(body.error.fieldErrors.pageSize);
    });
  });

  describe('POST /api/ingredients/copy-reference', () => {
    test('a new organization starts its library as a copy of the reference tables, once', async () => {
      const first = await outsider.call('POST', '/api/ingredients/copy-reference', {});
      assert.equal(first.status, 201);
      const reference = await outsider.call('GET', '/api/ingredients?library=reference&pageSize=1');
      const own = await outsider.call('GET', '/api/ingredients?library=own&pageSize=1');
      assert.ok(first.body.copied > 0);
      assert.ok(own.body.total >= reference.body.total, 'every reference ingredient has a copy');
      const again = await outsider.call('POST', '/api/ingredients/copy-reference', {});
      assert.equal(again.body.copied, 0);
    });
  });

  describe('copying and editing', () => {
    test('a copy diverges from the reference: edited values form a new value set and the reference keeps its numbers', async () => {
      const copy = await nutritionist.call('POST', `/api/ingredients/${ref.maize}/copy`, {});
      assert.equal(copy.status, 201);
      assert.equal(copy.body.library, 'own');
      assert.equal(copy.body.copiedFromId, ref.maize);
      const edit = await nutritionist.call('PATCH', `/api/ingredients/${copy.body.id}`, {
        values: { cp: 7.9 },
        source: { kind: 'lab', name: 'Mill lab, sample 14', analysedOn: '2026-03-10', dryMatterPct: 87.5 },
        expectedVersion: 1,
      });
      assert.equal(edit.status, 200);
      assert.equal(edit.body.version, 2);
      const cp = edit.body.nutrientValues.find((v: { nutrientId: string }) => v.nutrientId === 'cp');
      const set = edit.body.valueSets.find((s: { id: number }) => s.id === cp.valueSetId);
      assert.equal(cp.value, 7.9);
      assert.equal(set.sourceKind, 'lab');
      assert.equal(set.dryMatterPct, 87.5);
      const reference = await nutritionist.call('GET', `/api/ingredients/${ref.maize}`);
      assert.equal(reference.body.values.cp, 8.5);

      const stale = await nutritionist.call('PATCH', `/api/ingredients/${copy.body.id}`, { name: 'Old tab', expectedVersion: 1 });
      assert.equal(stale.status, 409);
      assert.equal((await nutritionist.call('GET', `/api/ingredients/${copy.body.id}`)).body.name, copy.body.name);
    });

    test('the reference library cannot be edited or deleted', async () => {
      const edit = await nutritionist.call('PATCH', `/api/ingredients/${ref.maize}`, { name: 'Changed' });
      assert.equal(edit.status, 403);
      assert.equal(edit.body.error.code, 'read_only');
      assert.equal((await nutritionist.call('DELETE', `/api/ingredients/${ref.maize}`)).status, 403);
    });

    test('bad values answer 400 per field and create nothing', async () => {
      const before = await countRows(ingredients);
      const unknown = await nutritionist.call('POST', '/api/ingredients', { name: 'Oats', category: 'cereal_grain', values: { cp: 11, protein: 3 }, source: { kind: 'estimate', name: 'Guess', dryMatterPct: 89 } });
      assert.equal(unknown.status, 400);
      assert.ok(unknown.body.error.fieldErrors['values.protein']);
      const tooMuch = await nutritionist.call('POST', '/api/ingredients', { name: 'Oats', category: 'cereal_grain', values: { cp: 110 }, source: { kind: 'estimate', name: 'Guess', dryMatterPct: 89 } });
      assert.equal(tooMuch.status, 400);
      assert.match(tooMuch.body.error.fieldErrors['values.cp'][0], /at most 100 %/);
      const noSource = await nutritionist.call('POST', '/api/ingredients', { name: 'Oats', category: 'cereal_grain', values: { cp: 11 } });
      assert.equal(noSource.status, 400);
      assert.ok(noSource.body.error.fieldErrors.source);
      assert.equal(await countRows(ingredients), before);
    });

    test('an advisor records a lab analysis on a dry-matter basis; it is stored as fed', async () => {
      const copy = await nutritionist.call('POST', `/api/ingredients/${ref['soybean-meal-48']}/copy`, { name: 'Soybean meal, lot 7' });
      const lab = await advisor.call('POST', `/api/ingredients/${copy.body.id}/lab-analyses`, { laboratory: 'County lab', analysedOn: '2026-03-12', dryMatterPct: 90, basis: 'dry_matter', values: { cp: 52 } });
      assert.equal(lab.status, 201);
      // 52 % of DM at 90 % DM = 46.8 % as fed (value × DM / 100).
      assert.ok(Math.abs(lab.body.ingredient.values.cp - 46.8) < 1e-9);
      assert.equal(lab.body.ingredient.values.dm, 90);
      assert.equal((await advisor.call('PATCH', `/api/ingredients/${copy.body.id}`, { name: 'x' })).status, 403, 'advisors import lab values, they do not edit the library');
    });
  });

  describe('DELETE /api/ingredients/:id', () => {
    const rapeseed = { name: 'Rapeseed cake, lot 3', category: 'oilseed_meal', values: { cp: 34 }, source: { kind: 'estimate', name: 'Supplier sheet', dryMatterPct: 89 } };

    test('refused while a formula uses it, naming the formula; once taken out it goes, and the kept version keeps its values', async () => {
      const spec = await nutritionist.call('POST', `/api/specifications/${ref.starter}/copy`, { name: 'Starter for the delete test' });
      const maize = (await nutritionist.call('POST', `/api/ingredients/${ref.maize}/copy`, { name: 'Maize D' })).body.id;
      const sbm = (await nutritionist.call('POST', `/api/ingredients/${ref['soybean-meal-48']}/copy`, { name: 'SBM D' })).body.id;
      const cake = await nutritionist.call('POST', '/api/ingredients', rapeseed);
      assert.equal(cake.status, 201);
      const formula = await nutritionist.call('POST', '/api/formulas', {
        name: 'Starter with rapeseed cake',
        specificationId: spec.body.id,
        ingredients: [{ ingredientId: maize, pricePerKg: 0.2 }, { ingredientId: sbm, pricePerKg: 0.45 }, { ingredientId: cake.body.id, pricePerKg: 0.3 }],
      });
      assert.equal(formula.status, 201, JSON.stringify(formula.body));
      const version = await nutritionist.call('POST', `/api/formulas/${formula.body.id}/versions`, {});
      assert.equal(version.status, 201, JSON.stringify(version.body));

      const refused = await nutritionist.call('DELETE', `/api/ingredients/${cake.body.id}`);
      assert.equal(refused.status, 409);
      assert.equal(refused.body.error.code, 'in_use');
      assert.match(refused.body.error.message, /“Rapeseed cake, lot 3” was not deleted: it is used in the formula “Starter with rapeseed cake”/);
      assert.deepEqual(refused.body.error.fieldErrors.formulas, ['Starter with rapeseed cake']);
      assert.equal((await nutritionist.call('GET', `/api/ingredients/${cake.body.id}`)).status, 200, 'nothing deleted');

      const detail = (await nutritionist.call('GET', `/api/formulas/${formula.body.id}`)).body;
      const inputs = { ...detail.inputs, ingredients: detail.inputs.ingredients.filter((i: { ingredientId: number }) => i.ingredientId !== cake.body.id) };
      assert.equal((await nutritionist.call('PUT', `/api/formulas/${formula.body.id}`, { inputs })).status, 200);
      const deleted = await nutritionist.call('DELETE', `/api/ingredients/${cake.body.id}`);
      assert.equal(deleted.status, 204, JSON.stringify(deleted.body));
      assert.equal((await nutritionist.call('GET', `/api/ingredients/${cake.body.id}`)).status, 404);
      const db = app.database.db;
      assert.equal((await db.select({ n: count() }).from(ingredientNutrientValues).where(eq(ingredientNutrientValues.ingredientId, cake.body.id)))[0].n, 0);
      assert.equal((await db.select({ n: count() }).from(ingredientValueSets).where(eq(ingredientValueSets.ingredientId, cake.body.id)))[0].n, 0);

      // The kept version still reads, with the deleted ingredient's name and values as solved.
      const kept = await nutritionist.call('GET', `/api/formulas/${formula.body.id}/versions/${version.body.id}`);
      assert.equal(kept.status, 200);
      const used = kept.body.snapshot.ingredients.find((u: { ingredientId: number }) => u.ingredientId === cake.body.id);
      assert.equal(used.name, 'Rapeseed cake, lot 3');
      assert.equal(used.values.cp, 34);
      assert.equal(used.pricePerKg, 0.3);
      assert.equal((await nutritionist.call('GET', `/api/formulas/${formula.body.id}`)).status, 200);
    });

    test('refused while a specification limits it or a supply plan takes its values, naming each; nothing is changed', async () => {
      const meal = await nutritionist.call('POST', '/api/ingredients', {
        name: 'Larvae meal, vegetable waste',
        category: 'insect_meal',
        insect: { species: 'hermetia_illucens', processing: 'full_fat', substrate: 'Vegetable waste', substrateOrigin: 'plant', substrateAnimals: [] },
        values: { cp: 40 },
        source: { kind: 'estimate', name: 'Supplier sheet', dryMatterPct: 92 },
      });
      assert.equal(meal.status, 201, JSON.stringify(meal.body));
      const spec = await nutritionist.call('POST', '/api/specifications', { speciesId: ref['grow-finish-pig'], name: 'Grower with larvae meal', source: 'Own', bounds: [{ nutrientId: 'sid_lys', min: 0.98 }], caps: [{ scope: 'ingredient', ingredientId: meal.body.id, maxPct: 5, source: 'Own trial' }] });
      assert.equal(spec.status, 201, JSON.stringify(spec.body));
      const plan = await nutritionist.call('POST', '/api/supply-plans', { name: 'Vegetable waste rearing', streams: [{ name: 'Market waste', substrate: 'fruit_vegetable_waste', tonnesPerWeek: 2 }], mealIngredientId: meal.body.id });
      assert.equal(plan.status, 201, JSON.stringify(plan.body));

      const refused = await nutritionist.call('DELETE', `/api/ingredients/${meal.body.id}`);
      assert.equal(refused.status, 409);
      assert.match(refused.body.error.message, /inclusion limits of the specification “Grower with larvae meal”/);
      assert.match(refused.body.error.message, /supply plan “Vegetable waste rearing”/);
      assert.deepEqual(refused.body.error.fieldErrors, { specifications: ['Grower with larvae meal'], supplyPlans: ['Vegetable waste rearing'] });
      const after = await nutritionist.call('GET', `/api/specifications/${spec.body.id}`);
      assert.equal(after.body.caps.length, 1, 'the limit is still there');
      assert.equal((await nutritionist.call('GET', `/api/supply-plans/${plan.body.id}`)).body.mealIngredient.id, meal.body.id);
    });

    test('takes its analysis history with it; another organization’s ingredient answers 404', async () => {
      const cake = await nutritionist.call('POST', '/api/ingredients', { ...rapeseed, name: 'Rapeseed cake, lot 4' });
      const lab = await advisor.call('POST', `/api/ingredients/${cake.body.id}/lab-analyses`, { laboratory: 'County lab', analysedOn: '2026-03-12', dryMatterPct: 89, values: { cp: 33.1 } });
      assert.equal(lab.status, 201);
      assert.equal((await outsider.call('DELETE', `/api/ingredients/${cake.body.id}`)).status, 404);
      assert.equal((await nutritionist.call('DELETE', `/api/ingredients/${cake.body.id}`)).status, 204);
      assert.equal((await app.database.db.select({ n: count() }).from(labImportAnalyses).where(eq(labImportAnalyses.ingredientId, cake.body.id)))[0].n, 0);
    });
  });

  describe('insect meals', () => {
    const offalMeal = {
      name: 'Larvae meal on poultry offal',
      category: 'insect_meal',
      insect: { species: 'hermetia_illucens', processing: 'defatted', substrate: 'Poultry processing offal', substrateOrigin: 'animal', substrateAnimals: ['chicken'] },
      values: { cp: 55 },
      source: { kind: 'lab', name: 'Mill lab', analysedOn: '2026-03-01', dryMatterPct: 95 },
    };

    test('a substrate of animal origin must name its animals', async () => {
      const { status, body } = await nutritionist.call('POST', '/api/ingredients', { ...offalMeal, insect: { ...offalMeal.insect, substrateAnimals: [] } });
      assert.equal(status, 400);
      assert.match(body.error.fieldErrors['insect.substrateAnimals'][0], /name the animals/);
    });

    test('a meal reared on chicken offal is not offered for broilers, with the reason, but is for pigs', async () => {
      const created = await nutritionist.call('POST', '/api/ingredients', offalMeal);
      assert.equal(created.status, 201);
      assert.deepEqual(created.body.refusals.map((r: { family: string }) => r.family), ['poultry']);
      const forBroilers = await nutritionist.call('GET', `/api/ingredients?category=insect_meal&speciesId=${ref.broiler}`);
      const row = forBroilers.body.items.find((i: { id: number }) => i.id === created.body.id);
      assert.equal(row.offered.allowed, false);
      assert.match(row.offered.message, /Broiler chicken/);
      const forPigs = await nutritionist.call('GET', `/api/ingredients?category=insect_meal&speciesId=${ref['grow-finish-pig']}`);
      assert.equal(forPigs.body.items.find((i: { id: number }) => i.id === created.body.id).offered.allowed, true);

      const cap = { scope: 'ingredient', ingredientId: created.body.id, maxPct: 5, source: 'Own trial' };
      const broilerSpec = await nutritionist.call('POST', '/api/specifications', { speciesId: ref.broiler, name: 'With offal meal', source: 'Own', bounds: [], caps: [cap] });
      assert.equal(broilerSpec.status, 400);
      assert.match(broilerSpec.body.error.message, /cannot go into diets for Broiler chicken/);
      const pigSpec = await nutritionist.call('POST', '/api/specifications', { speciesId: ref['grow-finish-pig'], name: 'With offal meal', source: 'Own', bounds: [{ nutrientId: 'sid_lys', min: 0.98 }], caps: [cap] });
      assert.equal(pigSpec.status, 201);
      const starter = await nutritionist.call('GET', `/api/specifications/${ref.starter}`);
      assert.ok(starter.body.refusedIngredients.some((r: { id: number }) => r.id === created.body.id));
    });
  });

  describe('POST /api/prices', () => {
    test('saves many prices at once; one foreign id saves none; a back-dated price does not replace the current one', async () => {
      const a = (await nutritionist.call('POST', `/api/ingredients/${ref.maize}/copy`, { name: 'Maize A' })).body.id;
      const b = (await nutritionist.call('POST', `/api/ingredients/${ref['soybean-meal-48']}/copy`, { name: 'SBM A' })).body.id;
      const foreign = (await outsider.call('POST', `/api/ingredients/${ref.maize}/copy`, {})).body.id;
      const before = await countRows(ingredientPrices);
      const refused = await nutritionist.call('POST', '/api/prices', { effectiveOn: '2026-03-16', items: [{ ingredientId: a, pricePerKg: 0.23 }, { ingredientId: foreign, pricePerKg: 0.3 }] });
      assert.equal(refused.status, 404);
      assert.equal(await countRows(ingredientPrices), before, 'nothing half-written');

      const saved = await nutritionist.call('POST', '/api/prices', { effectiveOn: '2026-03-16', items: [{ ingredientId: a, pricePerKg: 0.23 }, { ingredientId: b, pricePerKg: 0.505 }] });
      assert.equal(saved.status, 201);
      assert.equal(saved.body.saved, 2);
      await nutritionist.call('POST', '/api/prices', { effectiveOn: '2026-03-09', items: [{ ingredientId: a, pricePerKg: 0.22 }] });
      const maize = await nutritionist.call('GET', `/api/ingredients/${a}`);
      assert.equal(maize.body.pricePerKg, 0.23);
      assert.equal(maize.body.priceDate, '2026-03-16');
      const history = await nutritionist.call('GET', `/api/prices?ingredientId=${a}`);
      assert.deepEqual(history.body.items.map((p: { effectiveOn: string }) => p.effectiveOn), ['2026-03-16', '2026-03-09']);

      const negative = await nutritionist.call('POST', '/api/prices', { effectiveOn: '2026-03-16', items: [{ ingredientId: a, pricePerKg: -1 }] });
      assert.equal(negative.status, 400);
      assert.ok(negative.body.error.fieldErrors['items[0].pricePerKg']);
    });
  });

  describe('specifications', () => {
    test('copy and adjust: the copy changes, the reference does not; set bounds keep their confidence', async () => {
      const copy = await nutritionist.call('POST', `/api/specifications/${ref.starter}/copy`, { name: 'Our starter' });
      assert.equal(copy.status, 201);
      assert.equal(copy.body.library, 'own');
      const bounds = copy.body.bounds.map((b: { nutrientId: string; min: number | null; max: number | null; note: string | null }) => ({ nutrientId: b.nutrientId, min: b.nutrientId === 'lys' ? 1.28 : b.min, max: b.max, note: b.note }));
      const body = { speciesId: copy.body.species.id, phaseId: copy.body.phase.id, name: 'Our starter', source: copy.body.source, bounds, ratios: [], caps: [], expectedVersion: 1 };
      const saved = await nutritionist.call('PUT', `/api/specifications/${copy.body.id}`, body);
      assert.equal(saved.status, 200);
      const lys = saved.body.bounds.find((b: { nutrientId: string }) => b.nutrientId === 'lys');
      const cp = saved.body.bounds.find((b: { nutrientId: string }) => b.nutrientId === 'cp');
      assert.equal(lys.min, 1.28);
      assert.equal(lys.confidence, null, 'a changed bound is the organization’s own');
      assert.equal(cp.confidence, 'verified');
      const reference = await nutritionist.call('GET', `/api/specifications/${ref.starter}`);
      assert.equal(reference.body.bounds.find((b: { nutrientId: string }) => b.nutrientId === 'lys').min, 1.1);
      assert.equal((await nutritionist.call('PUT', `/api/specifications/${ref.starter}`, body)).status, 403);
    });

    test('refuses a pig nutrient in a broiler specification and a minimum above its maximum', async () => {
      const wrongBasis = await nutritionist.call('POST', '/api/specifications', { speciesId: ref.broiler, name: 'Mixed', source: 'Own', bounds: [{ nutrientId: 'sid_lys', min: 1 }] });
      assert.equal(wrongBasis.status, 400);
      assert.match(wrongBasis.body.error.fieldErrors['bounds[0].nutrientId'][0], /not used in poultry diets/);
      const inverted = await nutritionist.call('POST', '/api/specifications', { speciesId: ref.broiler, name: 'Inverted', source: 'Own', bounds: [{ nutrientId: 'cp', min: 23, max: 20 }] });
      assert.equal(inverted.status, 400);
      assert.ok(inverted.body.error.fieldErrors['bounds[0].min']);
    });
  });
});
