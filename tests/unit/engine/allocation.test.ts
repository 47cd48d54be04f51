/**
 * Allocation of several formulas from shared stocks: the monolithic javascript-lp-solver
 * model, the decomposition over the stock rows and HiGHS must give the same total cost
 * (1e-6 relative), and a hand-checkable case must give the hand-computed stock value.
 */
import assert from 'node:assert/strict';
import { before, describe, test } from 'node:test';

import { getHighsSolver } from '../../../server/lp/highs-solver';
import { allocate, buildAllocationModel } from '../../../src/shared/engine/allocate';
import type { LpSolver } from '../../../src/shared/engine/lp-types';
import { allocationProblemSchema, type AllocationOptimal } from '../../../src/shared/schemas/formulation';
import { allocationProblem } from './generate';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1, Math.abs(b));

describe('allocation', () => {
  let highs: LpSolver;
  before(async () => {
    highs = await getHighsSolver();
  });

  // Hand check (arithmetic by hand, no published source): two formulas of 1,000 kg each need
  // 20 % protein; a cheap 40 % protein meal (0.30/kg, 300 kg in stock) competes with a dear
  // 40 % meal (0.50/kg); the filler is 0 % protein at 0.20/kg. Each formula needs 500 kg of
  // 40 % meal; stock covers 300 kg, so 700 kg of the dear meal is bought: total cost
  // 2 × 500 × 0.20 + 300 × 0.30 + 700 × 0.50 = 640; one more kg of stock saves 0.20 → 200 per tonne.
  test('hand-checkable stock value: 200 per tonne, total 640', () => {
    const problem = {
      ingredients: [
        { id: 'filler', pricePerKg: 0.2, nutrients: { cp: 0 } },
        { id: 'larvae-meal', pricePerKg: 0.3, stockKg: 300, nutrients: { cp: 40 } },
        { id: 'soy-meal', pricePerKg: 0.5, nutrients: { cp: 40 } },
      ],
      formulas: [
        { id: 'starter', batchKg: 1000, nutrients: [{ id: 'cp', min: 20 }] },
        { id: 'grower', batchKg: 1000, nutrients: [{ id: 'cp', min: 20 }] },
      ],
    };
    for (const method of ['direct', 'decomposition'] as const) {
      const r = allocate(problem, { method });
      assert.equal(r.status, 'optimal', method);
      const a = r as AllocationOptimal;
      assert.ok(Math.abs(a.totalCost - 640) < 1e-6, `${method}: ${a.totalCost}`);
      const s = a.stocks.find((x) => x.id === 'larvae-meal')!;
      assert.equal(s.binding, true);
      assert.ok(Math.abs(s.usedKg - 300) < 1e-6);
      assert.ok(Math.abs(s.valuePerTonne - 200) < 1e-6, `${method}: ${s.valuePerTonne}`);
    }
  });

  test('short stock is explained: how much more is needed', () => {
    const r = allocate({
      ingredients: [
        { id: 'filler', pricePerKg: 0.2, nutrients: { cp: 0 } },
        { id: 'larvae-meal', pricePerKg: 0.3, stockKg: 600, nutrients: { cp: 40 } },
      ],
      formulas: [
        { id: 'starter', batchKg: 1000, nutrients: [{ id: 'cp', min: 20 }] },
        { id: 'grower', batchKg: 1000, nutrients: [{ id: 'cp', min: 20 }] },
      ],
    });
    // Each formula alone needs 500 kg (600 kg in stock); together they need 1,000 kg.
    assert.equal(r.status, 'infeasible');
    if (r.status !== 'infeasible') return;
    assert.equal(r.relaxations[0].id, 'larvae-meal');
    assert.ok(Math.abs(r.relaxations[0].reaches - 1000) < 1e-6, JSON.stringify(r));
    assert.match(r.message, /need at least 1000 kg/);
  });

  test('a formula that cannot be made alone is named, with its relaxation', () => {
    const r = allocate({
      ingredients: [{ id: 'filler', pricePerKg: 0.2, nutrients: { cp: 5 } }],
      formulas: [{ id: 'hopeless', batchKg: 1000, nutrients: [{ id: 'cp', min: 20 }] }],
    });
    assert.equal(r.status, 'infeasible');
    if (r.status === 'infeasible') assert.equal(r.formula, 'hopeless');
  });

  test('direct, decomposed and HiGHS agree on generated allocations (2–20 formulas)', () => {
    let stockChecks = 0;
    for (const [formulas, seed] of [[2, 1], [3, 2], [5, 3], [8, 4], [12, 5], [20, 6], [20, 7]]) {
      const p = allocationProblemSchema.parse(allocationProblem(formulas, seed));
      const direct = allocate(p, { method: 'direct', trusted: true });
      const dw = allocate(p, { method: 'decomposition', trusted: true });
      const hi = allocate(p, { method: 'large', largeSolver: highs, trusted: true });
      assert.equal(direct.status, 'optimal', `${formulas}: ${JSON.stringify(direct).slice(0, 200)}`);
      assert.equal(dw.status, 'optimal');
      assert.equal(hi.status, 'optimal');
      const [a, b, c] = [direct, dw, hi] as AllocationOptimal[];
      assert.ok(rel(a.totalCost, c.totalCost) <= 1e-6, `${formulas}: direct ${a.totalCost} vs HiGHS ${c.totalCost}`);
      assert.ok(rel(b.totalCost, c.totalCost) <= 1e-6, `${formulas}: decomposition ${b.totalCost} vs HiGHS ${c.totalCost}`);
      // Stock values are unique when HiGHS's optimum is non-degenerate.
      const h = highs.solve(buildAllocationModel(p).lp);
      if (h.status === 'optimal' && !h.degenerate) {
        for (let k = 0; k < c.stocks.length; k++) {
          assert.ok(rel(a.stocks[k].valuePerTonne, c.stocks[k].valuePerTonne) <= 1e-5, `stock ${c.stocks[k].id}`);
          assert.ok(rel(b.stocks[k].valuePerTonne, c.stocks[k].valuePerTonne) <= 1e-5, `stock ${c.stocks[k].id} (decomposition)`);
          stockChecks++;
        }
      }
      assert.ok(c.stocks.some((s) => s.binding), `${formulas}: no stock binds; the case tests nothing`);
    }
    process.stdout.write(`# allocation: stock value comparisons ${stockChecks}\n`);
  });
});
