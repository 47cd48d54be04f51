import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import { and, eq, isNull } from 'drizzle-orm';

import type { Db } from '../../server/db/client';
import { ingredientNutrientValues, ingredients, ingredientValueSets, species, specificationNutrients, specifications, supplyPlans, supplyStreams } from '../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { createOrganization, createUser, signedInClient, type Client } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';

const close = (actual: number, expected: number, tol: number, what: string) =>
  assert.ok(Math.abs(actual - expected) <= tol, `${what}: expected ${expected} ± ${tol}, got ${actual}`);

/** An ingredient of the organization's own library with one value set. */
async function ownIngredient(db: Db, organizationId: number, row: { name: string; category: 'cereal_grain' | 'oilseed_meal' | 'insect_meal'; price: number | null; lab?: boolean; dm: number; values: Record<string, number> }) {
  const [{ id }] = await db
    .insert(ingredients)
    .values({
      organizationId,
      name: row.name,
      category: row.category,
      pricePerKg: row.price === null ? null : row.price.toFixed(4),
      ...(row.category === 'insect_meal' ? { insectSpecies: 'hermetia_illucens' as const, insectProcessing: 'full_fat' as const, substrate: 'Brewery grains', substrateOrigin: 'plant' as const, substrateAnimals: [] } : {}),
    })
    .$returningId();
  const [{ id: setId }] = await db
    .insert(ingredientValueSets)
    .values({ ingredientId: id, sourceKind: row.lab ? 'lab' : 'estimate', sourceName: row.lab ? 'Test laboratory, report 1' : 'Test values', confidence: 'verified', dryMatterPct: row.dm, analysedOn: row.lab ? '2026-03-01' : null })
    .$returningId();
  await db.insert(ingredientNutrientValues).values(Object.entries({ dm: row.dm, ...row.values }).map(([nutrientId, value]) => ({ ingredientId: id, nutrientId, valueSetId: setId, value })));
  return id;
}

/** An own specification with one bound: crude protein at least `cpMin` %. */
async function proteinSpec(db: Db, organizationId: number, speciesCode: string, name: string, cpMin: number) {
  const [s] = await db.select().from(species).where(and(isNull(species.organizationId), eq(species.code, speciesCode)));
  const [{ id }] = await db.insert(specifications).values({ organizationId, speciesId: s.id, name, source: 'Test: protein only' }).$returningId();
  await db.insert(specificationNutrients).values({ specificationId: id, nutrientId: 'cp', min: cpMin });
  return id;
}

describe('supply plans API', () => {
  let app: TestApp;
  let db: Db;
  let owner: Client;
  let advisor: Client;
  let outsider: Client;
  let orgId: number;
  let labMealId: number;

  before(async () => {
    app = await startTestApp('supply-plans');
    db = app.database.db;
    await seedDemoData(db, [REFERENCE_LIBRARY_STEP]);
    const org = await createOrganization(db, 'Test Larvae Farm', 'farm');
    const other = await createOrganization(db, 'Other Mill');
    orgId = org.id;
    await createUser(db, { email: 'owner@farm.test', organizationId: org.id, role: 'owner' });
    await createUser(db, { email: 'advisor@farm.test', organizationId: org.id, role: 'advisor' });
    await createUser(db, { email: 'owner@other.test', organizationId: other.id, role: 'owner' });
    owner = await signedInClient(app.server.baseUrl, 'owner@farm.test');
    advisor = await signedInClient(app.server.baseUrl, 'advisor@farm.test');
    outsider = await signedInClient(app.server.baseUrl, 'owner@other.test');
    // The farm's own meal: a lab analysis of 40 % crude protein at 92 % dry matter.
    labMealId = await ownIngredient(db, org.id, { name: 'Farm larvae meal', category: 'insect_meal', price: 1.1, lab: true, dm: 92, values: { cp: 40 } });
  });
  after(async () => app?.close());

  describe('POST /api/supply-plans', () => {
    test('creates a plan with its streams and answers the computed week', async () => {
      const { status, body } = await owner.call('POST', '/api/supply-plans', {
        name: 'Week plan',
        streams: [
          { name: 'Brewery grains', substrate: 'brewery_grains', tonnesPerWeek: 6 },
          { name: 'Vegetables', substrate: 'fruit_vegetable_waste', tonnesPerWeek: 4, moisturePct: 90 },
        ],
      });
      assert.equal(status, 201, JSON.stringify(body));
      assert.equal(body.streams.length, 2);
      assert.equal(body.streamCount, 2);
      const t = body.plan.totals;
      close(t.substrateFreshKg, 10_000, 1e-6, 'fresh substrate');
      close(t.substrateWaterKg, t.larvaeWaterKg + t.residueWaterKg + t.waterLostKg, 1e-6, 'water balance');
      close(t.substrateDryMatterKg, t.larvaeDryMatterKg + t.residueDryMatterKg + t.respiredDryMatterKg, 1e-6, 'dry matter balance');
      assert.ok(body.plan.processing.mealKg > 0);
      assert.equal(body.flags.filter((f: { notAllowed: unknown[] }) => f.notAllowed.length > 0).length, 0, 'nothing flagged for grains and vegetables');
      assert.deepEqual(body.speciesRule.refused, []);
      assert.ok(body.landUse.soybeanHa > 0);
      assert.match(body.landUse.yieldSource, /from memory/);
      const rows = await db.select().from(supplyStreams).where(eq(supplyStreams.planId, body.id));
      assert.equal(rows.length, 2);
      assert.equal(rows.find((r) => r.name === 'Vegetables')!.moisturePct, 90);
    });

    test('answers 400 with field errors and saves nothing when a stream is wrong', async () => {
      const before = (await db.select().from(supplyPlans)).length;
      const { status, body } = await owner.call('POST', '/api/supply-plans', {
        name: 'Bad plan',
        streams: [
          { name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: -1 },
          { name: 'Grains with animals', substrate: 'brewery_grains', tonnesPerWeek: 1, animals: ['pig'] },
        ],
      });
      assert.equal(status, 400);
      assert.deepEqual(body.error.fieldErrors['streams[0].tonnesPerWeek'], ['tonnes per week cannot be negative']);
      assert.match(body.error.fieldErrors['streams[1].animals'][0], /plant origin/);
      assert.equal((await db.select().from(supplyPlans)).length, before);
    });

    test('a farm member cannot create a plan (403)', async () => {
      await createUser(db, { email: 'member@farm.test', organizationId: orgId, role: 'farm_member' });
      const member = await signedInClient(app.server.baseUrl, 'member@farm.test');
      const { status } = await member.call('POST', '/api/supply-plans', { name: 'x', streams: [{ name: 'g', substrate: 'brewery_grains', tonnesPerWeek: 1 }] });
      assert.equal(status, 403);
    });
  });

  describe('GET and PUT /api/supply-plans/:id', () => {
    test('flags a forbidden substrate and shows the species rule on the meal', async () => {
      const created = await owner.call('POST', '/api/supply-plans', {
        name: 'Manure plan',
        streams: [{ name: 'Layer manure', substrate: 'manure', tonnesPerWeek: 2, animals: ['chicken'] }],
      });
      const { status, body } = await owner.call('GET', `/api/supply-plans/${created.body.id}`);
      assert.equal(status, 200);
      const flag = body.flags.find((f: { streamName: string }) => f.streamName === 'Layer manure');
      assert.ok(flag.notAllowed.some((n: { jurisdiction: string }) => n.jurisdiction === 'EU'));
      assert.deepEqual(body.speciesRule.refused.map((r: { family: string }) => r.family), ['poultry']);
      assert.match(body.speciesRule.refused[0].message, /chicken/);
    });

    test('a linked lab analysis overrides the estimated protein', async () => {
      const { body } = await owner.call('POST', '/api/supply-plans', { name: 'Lab plan', mealIngredientId: labMealId, streams: [{ name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 3 }] });
      const cp = body.plan.mealComposition.find((l: { id: string }) => l.id === 'cp');
      assert.equal(cp.origin, 'lab');
      close(cp.asFedPct, 40, 1e-9, 'CP from the lab at the same dry matter');
      assert.match(body.mealIngredient.labSource, /Test laboratory/);
      const ash = body.plan.mealComposition.find((l: { id: string }) => l.id === 'ash');
      assert.equal(ash.origin, 'estimate');
    });

    test('a stale version answers 409 and leaves the plan as it was', async () => {
      const { body } = await owner.call('POST', '/api/supply-plans', { name: 'Versioned', streams: [{ name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 3 }] });
      const first = await owner.call('PUT', `/api/supply-plans/${body.id}`, { name: 'Versioned', expectedVersion: 1, streams: [{ name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 5 }] });
      assert.equal(first.status, 200);
      assert.equal(first.body.version, 2);
      const stale = await owner.call('PUT', `/api/supply-plans/${body.id}`, { name: 'Renamed', expectedVersion: 1, streams: [{ name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 9 }] });
      assert.equal(stale.status, 409);
      const now = await owner.call('GET', `/api/supply-plans/${body.id}`);
      assert.equal(now.body.name, 'Versioned');
      assert.equal(now.body.streams[0].tonnesPerWeek, 5);
    });

    test('another organization’s plan answers 404', async () => {
      const { body } = await owner.call('POST', '/api/supply-plans', { name: 'Private', streams: [{ name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 1 }] });
      assert.equal((await outsider.call('GET', `/api/supply-plans/${body.id}`)).status, 404);
      assert.equal((await outsider.call('DELETE', `/api/supply-plans/${body.id}`)).status, 404);
      assert.ok((await outsider.call('GET', '/api/supply-plans')).body.every((p: { id: number }) => p.id !== body.id));
    });

    test('the soybean yield can be edited, with its source', async () => {
      const { body } = await owner.call('POST', '/api/supply-plans', {
        name: 'Land',
        soybeanYieldTPerHa: 3.4,
        soybeanYieldSource: 'County average, last five harvests',
        streams: [{ name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 6 }],
      });
      close(body.landUse.soybeanHa, (body.plan.processing.mealProteinKg * 52) / 1000 / ((3.4 * 37) / 100), 1e-9, 'hectares');
      assert.equal(body.landUse.yieldSource, 'County average, last five harvests');
    });
  });

  describe('POST /api/supply-plans/:id/allocate', () => {
    let fillerId: number;
    let soyId: number;
    let broilerSpec: number;
    let pigSpec: number;

    before(async () => {
      fillerId = await ownIngredient(db, orgId, { name: 'Filler', category: 'cereal_grain', price: 0.2, dm: 90, values: { cp: 0 } });
      soyId = await ownIngredient(db, orgId, { name: 'Dear protein meal', category: 'oilseed_meal', price: 0.5, dm: 90, values: { cp: 40 } });
      broilerSpec = await proteinSpec(db, orgId, 'broiler', 'Test broiler, CP 20 %', 20);
      pigSpec = await proteinSpec(db, orgId, 'grow-finish-pig', 'Test grower pig, CP 20 %', 20);
    });

    // The engine's hand-checkable allocation (tests/unit/engine/allocation.test.ts): two formulas of 1,000 kg at
    // CP ≥ 20 %, a 40 % CP meal at 0.30/kg with 300 kg in stock, a dear 40 % meal at 0.50/kg and a 0 % filler at
    // 0.20/kg: total 640, meal worth 200 per tonne. Without the meal: 2 × (500 × 0.20 + 500 × 0.50) = 700.
    // The plan gives exactly 300 kg of 40 % CP meal: 6.9 t at 80 % water × 20 % bioconversion = 276 kg larval DM
    // = 300 kg of meal at 92 % DM; the linked lab analysis sets CP to 40 % as fed.
    test('agrees with the engine’s hand-checked allocation: total 640, saving 60, 200 per tonne', async () => {
      const plan = await owner.call('POST', '/api/supply-plans', {
        name: 'Hand check',
        mealIngredientId: labMealId,
        streams: [{ name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 6.9, moisturePct: 80, bioconversionDmPct: 20 }],
      });
      close(plan.body.plan.processing.mealKg, 300, 1e-9, 'meal per week');
      const { status, body } = await advisor.call('POST', `/api/supply-plans/${plan.body.id}/allocate`, {
        formulas: [{ specificationId: broilerSpec, tonnesPerWeek: 1 }, { specificationId: pigSpec, tonnesPerWeek: 1 }],
        ingredients: [{ ingredientId: fillerId }, { ingredientId: soyId }],
        mealPricePerKg: 0.3,
      });
      assert.equal(status, 200, JSON.stringify(body));
      assert.equal(body.status, 'optimal');
      close(body.totalCost, 640, 1e-6, 'total cost with the meal');
      close(body.totalCostWithoutMeal, 700, 1e-6, 'total cost without it');
      close(body.saving, 60, 1e-6, 'saving');
      close(body.mealUsedKg, 300, 1e-6, 'meal used');
      close(body.mealLeftKg, 0, 1e-6, 'meal left');
      close(body.mealValuePerTonne, 200, 1e-6, 'one more tonne of meal');
      close(body.formulas.reduce((s: number, f: { mealKg: number }) => s + f.mealKg, 0), 300, 1e-6, 'meal over the formulas');
      assert.ok(body.formulas.every((f: { mealOffered: boolean }) => f.mealOffered));
    });

    test('the species rule keeps a meal reared on chicken by-products out of the broiler formula', async () => {
      const plan = await owner.call('POST', '/api/supply-plans', {
        name: 'Offal plan',
        mealIngredientId: labMealId,
        streams: [{ name: 'Chicken trimmings', substrate: 'slaughter_by_products', tonnesPerWeek: 6.9, moisturePct: 80, bioconversionDmPct: 20, animals: ['chicken'] }],
      });
      const { status, body } = await owner.call('POST', `/api/supply-plans/${plan.body.id}/allocate`, {
        formulas: [{ specificationId: broilerSpec, tonnesPerWeek: 1 }, { specificationId: pigSpec, tonnesPerWeek: 1 }],
        ingredients: [{ ingredientId: fillerId }, { ingredientId: soyId }],
        mealPricePerKg: 0.3,
      });
      assert.equal(status, 200, JSON.stringify(body));
      const broiler = body.formulas.find((f: { specificationId: number }) => f.specificationId === broilerSpec);
      const pig = body.formulas.find((f: { specificationId: number }) => f.specificationId === pigSpec);
      assert.equal(broiler.mealOffered, false);
      assert.equal(broiler.mealKg, 0);
      assert.match(broiler.refusal, /Broiler chicken/);
      assert.equal(pig.mealOffered, true);
      close(pig.mealKg, 300, 1e-6, 'all the meal goes to the pigs');
      // Broiler: 500 filler + 500 dear meal = 350; pig with 300 kg meal: 100 + 90 + 100 = 290.
      close(body.totalCost, 640, 1e-6, 'total');
      const broilerResult = body.result.formulas.find((f: { name: string }) => f.name === 'Test broiler, CP 20 %');
      assert.ok(!broilerResult.mix.some((m: { id: string }) => m.id === 'planned-meal'));
    });

    test('an ingredient without a price answers 400 with the field to fix', async () => {
      const unpriced = await ownIngredient(db, orgId, { name: 'Unpriced wheat', category: 'cereal_grain', price: null, dm: 88, values: { cp: 12 } });
      const plan = (await owner.call('GET', '/api/supply-plans')).body[0];
      const { status, body } = await owner.call('POST', `/api/supply-plans/${plan.id}/allocate`, {
        formulas: [{ specificationId: pigSpec, tonnesPerWeek: 1 }],
        ingredients: [{ ingredientId: fillerId }, { ingredientId: unpriced }],
        mealPricePerKg: 0.3,
      });
      assert.equal(status, 400);
      assert.match(body.error.fieldErrors['ingredients[1].pricePerKg'][0], /no price in the library/);
    });

    test('the allocation options list the organization’s ingredients, specifications and insect meals', async () => {
      const { status, body } = await advisor.call('GET', '/api/supply-plans/allocation-options');
      assert.equal(status, 200);
      assert.ok(body.specifications.some((s: { id: number }) => s.id === broilerSpec));
      assert.ok(body.ingredients.some((i: { id: number }) => i.id === fillerId));
      assert.deepEqual(body.insectMeals.map((m: { id: number; hasLab: boolean }) => [m.id, m.hasLab]), [[labMealId, true]]);
    });
  });
});
