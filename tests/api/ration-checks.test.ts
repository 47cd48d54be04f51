import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import { and, eq, isNull } from 'drizzle-orm';

import { ingredients, specifications } from '../../server/db/schema';
import type { RationCheckResponse, RationChoices } from '../../src/shared/schemas/ration-checks';
import type { Client } from '../helpers/accounts';
import { organizationId, signInAsDemo, startDemoApp } from '../helpers/demo';
import type { TestApp } from '../helpers/app';

const close = (actual: number, expected: number, tol: number, what: string) => assert.ok(Math.abs(actual - expected) <= tol, `${what}: ${actual} is not within ${tol} of ${expected}`);

/**
 * "Check my ration" for the demo farm. Requirement: NRC (1994) broiler starter, total lysine 1.10 % of
 * the diet ([V], broiler requirement table as adapted in the Merck Veterinary Manual). The maize and
 * soybean meal values are typed in by the farmer (inputs recalled from memory, not check values).
 */
describe('ration checks API', () => {
  let app: TestApp;
  let farmer: Client;
  let operator: Client;
  let starterId: number;
  let refSoyId: number;

  const typedMix = (maizeKg = 700, soyKg = 300) => ({
    specificationId: starterId,
    lines: [
      { name: 'Home-grown maize', kg: maizeKg, pricePerKg: 0.229, values: { lys: 0.26 } },
      { name: 'Soybean meal from the co-op', kg: soyKg, pricePerKg: 0.512, values: { lys: 2.96 } },
    ],
  });

  before(async () => {
    app = await startDemoApp('ration_checks_api');
    const db = app.database.db;
    const base = app.server.baseUrl;
    farmer = await signInAsDemo(base, 'farmer@orrinhollow.example');
    await farmer.call('PUT', '/api/auth/active-organization', { organizationId: await organizationId(db, 'Orrin Hollow Larvae Farm') });
    operator = await signInAsDemo(base, 'operator@tamsby.example');
    starterId = (await db.select().from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, 'nrc1994-broiler-starter'))))[0].id;
    refSoyId = (await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, 'soybean-meal-48'))))[0].id;
  });
  after(async () => app?.close());

  describe('GET /api/ration-checks/choices', () => {
    test('offers the reference requirements and ingredients and the nutrients to type', async () => {
      const { status, body } = await farmer.call('GET', '/api/ration-checks/choices');
      assert.equal(status, 200);
      const c = body as RationChoices;
      assert.ok(c.specifications.some((s) => s.id === starterId && s.library === 'reference'));
      assert.ok(c.ingredients.some((i) => i.id === refSoyId));
      assert.ok(c.nutrients.some((n) => n.id === 'lys' && n.unit === '%'));
    });
  });

  describe('POST /api/ration-checks', () => {
    test('finds lysine short in 700 kg maize + 300 kg soybean meal and gives the cost per kg', async () => {
      const { status, body } = await farmer.call('POST', '/api/ration-checks', typedMix());
      assert.equal(status, 200);
      const r = body as RationCheckResponse;
      const lys = r.result.findings.find((f) => f.id === 'lys')!;
      assert.equal(lys.kind, 'short');
      // (700 × 0.26 + 300 × 2.96) / 1000 = 1.07 %, below NRC 1994's 1.10 %.
      close(lys.value!, 1.07, 1e-9, 'lysine');
      close(lys.min!, 1.1, 1e-12, 'requirement');
      // (700 × 0.229 + 300 × 0.512) / 1000 = 0.3139 per kg.
      close(r.result.costPerKg!, 0.3139, 1e-12, 'cost per kg');
      assert.ok(r.result.summary.some((s) => /0\.3139 EUR per kg/.test(s)));
      assert.equal(r.requirement.species, 'Broiler chicken');
      // Nutrients the typed ingredients carry no value for cannot be judged, and say so.
      assert.ok(r.result.findings.some((f) => f.kind === 'unknown'));
      // Every correction is reported, found or not; none is hidden.
      assert.equal(r.result.corrections.length, 2);
    });

    test('a library ingredient brings its own values and can be corrected with its price', async () => {
      const { status, body } = await farmer.call('POST', '/api/ration-checks', { specificationId: starterId, lines: [typedMix().lines[0], { ingredientId: refSoyId, kg: 300, pricePerKg: 0.5 }] });
      assert.equal(status, 200);
      const r = body as RationCheckResponse;
      assert.equal(r.lines[1].fromLibrary, true);
      assert.ok(r.result.findings.find((f) => f.id === 'cp')!.value! > 0, 'crude protein from the library values');
    });

    test('returns 400 with field errors that say what to fix', async () => {
      const noValues = await farmer.call('POST', '/api/ration-checks', { specificationId: starterId, lines: [{ name: 'Mystery meal', kg: 10 }] });
      assert.equal(noValues.status, 400);
      assert.match(JSON.stringify(noValues.body.error.fieldErrors), /at least one nutrient value/);
      const zero = await farmer.call('POST', '/api/ration-checks', typedMix(0, 0));
      assert.equal(zero.status, 400);
      assert.match(JSON.stringify(zero.body.error.fieldErrors), /weighs 0 kg/);
      const unknownNutrient = await farmer.call('POST', '/api/ration-checks', { specificationId: starterId, lines: [{ name: 'Maize', kg: 10, values: { lysine: 0.26 } }] });
      assert.equal(unknownNutrient.status, 400);
      assert.match(JSON.stringify(unknownNutrient.body.error.fieldErrors), /not a nutrient in the catalogue/);
      const noSpec = await farmer.call('POST', '/api/ration-checks', { ...typedMix(), specificationId: 999999 });
      assert.equal(noSpec.status, 400);
    });

    test('returns 403 for a mill operator', async () => {
      assert.equal((await operator.call('POST', '/api/ration-checks', typedMix())).status, 403);
    });
  });
});
