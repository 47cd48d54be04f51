/**
 * Price sweep ("what is insect meal worth"): warm re-solves agree with cold solves, and the
 * entering price agrees with the ranging of a single solve.
 */
import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { solveFormula } from '../../../src/shared/engine/formulate';
import { priceSweep } from '../../../src/shared/engine/price-sweep';
import type { OptimalResult, PriceSweepResult } from '../../../src/shared/schemas/formulation';
import { broilerProblem } from './generate';

describe('price sweep', () => {
  test('insect meal: points match cold solves; entering price matches ranging', () => {
    const problem = broilerProblem(2);
    const id = 'bsf-defatted';
    const r = priceSweep({ problem, ingredient: id, fromPrice: 0.2, toPrice: 1.6, steps: 15 }) as PriceSweepResult;
    assert.equal(r.status, 'swept');
    for (const pt of r.points) {
      const q = structuredClone(problem);
      q.ingredients.find((i) => i.id === id)!.pricePerKg = pt.pricePerKg;
      const cold = solveFormula(q) as OptimalResult;
      assert.ok(Math.abs(cold.costPerBatch - (pt.costPerBatch as number)) <= 1e-6 * cold.costPerBatch, `cost at ${pt.pricePerKg}`);
    }
    // Inclusion never rises with the ingredient's own price.
    for (let k = 1; k < r.points.length; k++) assert.ok((r.points[k].kg as number) <= (r.points[k - 1].kg as number) + 1e-6);
    assert.ok(r.entersAtPrice !== null);
    const q = structuredClone(problem);
    q.ingredients.find((i) => i.id === id)!.pricePerKg = (r.entersAtPrice as number) * 1.001 + 1e-9;
    const out = solveFormula(q) as OptimalResult;
    const rg = out.ranging.find((x) => x.id === id)!;
    assert.equal(rg.inMix, false);
    if (!rg.inMix) assert.ok(Math.abs((rg.entersAtPrice as number) - (r.entersAtPrice as number)) < 1e-6);
    for (const b of r.breakpoints) assert.ok(b > 0.2 && b < 1.6);
  });
});

describe('price sweep breakpoints', () => {
  test('are strictly increasing: no price is listed twice, even at a degenerate optimum', () => {
    // Two ingredients identical in composition make the optimum degenerate at every price of the swept one.
    const problem = {
      batchKg: 1000,
      ingredients: [
        { id: 'grain', pricePerKg: 0.2, nutrients: { cp: 9 } },
        { id: 'meal-a', pricePerKg: 0.5, nutrients: { cp: 45 } },
        { id: 'meal-b', pricePerKg: 0.5, nutrients: { cp: 45 } },
        { id: 'insect', pricePerKg: 0.3, maxPercent: 10, nutrients: { cp: 50 } },
      ],
      nutrients: [{ id: 'cp', min: 18 }],
    };
    const result = priceSweep({ problem, ingredient: 'insect', fromPrice: 0.1, toPrice: 1.5, steps: 8 });
    assert.equal(result.status, 'swept');
    if (result.status !== 'swept') return;
    for (let i = 1; i < result.breakpoints.length; i++) assert.ok(result.breakpoints[i] > result.breakpoints[i - 1], `breakpoints ${result.breakpoints.join(', ')}`);
    assert.ok(result.entersAtPrice !== null && result.entersAtPrice > 0.45 && result.entersAtPrice < 0.6, `enters at ${result.entersAtPrice}`);
  });
});
