/**
 * "Check my ration": evaluating a given mix without optimising.
 */
import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { evaluateMix } from '../../../src/shared/engine/evaluate';
import type { EvaluationResult } from '../../../src/shared/schemas/formulation';

const spec = {
  ingredients: [
    { id: 'corn', pricePerKg: 0.25, nutrients: { cp: 8.9, fibre: 2.2 } },
    { id: 'sbm', pricePerKg: 0.45, nutrients: { cp: 44.4, fibre: 7 } },
  ],
  nutrients: [
    { id: 'cp', unit: '%', min: 18 },
    { id: 'fibre', unit: '%', max: 3 },
  ],
};

describe('evaluate a given mix', () => {
  // Source: Pearson square, swine example (agricultural-education worked example): 1,487.3 lb corn
  // + 512.7 lb SBM per 2,000 lb is 18 % CP; levels checked by hand: (1487.3 × 8.9 + 512.7 × 44.4) / 2000 = 18.00.
  test('the Pearson-square mix meets 18 % CP and costs what its lines cost', () => {
    const r = evaluateMix({ ...spec, mix: [{ id: 'corn', kg: 1487.3 }, { id: 'sbm', kg: 512.7 }] }) as EvaluationResult;
    assert.equal(r.status, 'evaluated');
    const cp = r.nutrients.find((n) => n.id === 'cp')!;
    assert.ok(Math.abs(cp.value - (1487.3 * 8.9 + 512.7 * 44.4) / 2000) < 1e-12);
    assert.ok(Math.abs(cp.value - 18) < 0.001);
    assert.ok(Math.abs(r.costPerBatch - (1487.3 * 0.25 + 512.7 * 0.45)) < 1e-9);
    assert.equal(r.totalKg, 2000);
    // Fibre: (1487.3 × 2.2 + 512.7 × 7) / 2000 = 3.43 % > 3 % max, by 0.43.
    assert.equal(r.meetsSpecification, false);
    assert.equal(r.misses.length, 1);
    assert.equal(r.misses[0].constraint, 'nutrients[fibre].max');
    assert.ok(Math.abs(r.misses[0].by - ((1487.3 * 2.2 + 512.7 * 7) / 2000 - 3)) < 1e-12);
  });

  test('percent lines, a batch that does not add up, and ingredient limits', () => {
    const r = evaluateMix({
      ...spec,
      batchKg: 1000,
      ingredients: [{ ...spec.ingredients[0], maxKg: 500 }, spec.ingredients[1]],
      mix: [{ id: 'corn', percent: 80 }, { id: 'sbm', percent: 15 }],
    }) as EvaluationResult;
    assert.equal(r.status, 'evaluated');
    const kinds = r.misses.map((m) => m.constraint).sort();
    assert.deepEqual(kinds, ['batchKg', 'ingredients[corn].maxKg', 'nutrients[cp].min']);
  });
});
