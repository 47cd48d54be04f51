/**
 * Shadow prices and price ranging mean what they say: checked by re-solving with the
 * bound or price moved (finite differences), independently of how they were computed.
 */
import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { solveFormula } from '../../../src/shared/engine/formulate';
import type { FormulaProblem, OptimalResult } from '../../../src/shared/schemas/formulation';
import { broilerProblem } from './generate';

function opt(p: unknown): OptimalResult {
  const r = solveFormula(p);
  assert.equal(r.status, 'optimal', JSON.stringify(r).slice(0, 300));
  return r as OptimalResult;
}

describe('sensitivity by finite differences', () => {
  for (const seed of [1, 2, 3, 4, 5]) {
    test(`broiler ration ${seed}: every binding nutrient, ratio and group shadow price matches a re-solve`, () => {
      const p = broilerProblem(seed);
      const r = opt(p);
      let checked = 0;
      const diff = (mutate: (q: FormulaProblem) => void, h: number, expected: number, what: string) => {
        const q = structuredClone(p);
        mutate(q);
        const up = solveFormula(q);
        if (up.status !== 'optimal') return;
        const slope = (up.costPerBatch - r.costPerBatch) / h;
        // A small step can cross a breakpoint; accept the shadow price as a one-sided derivative.
        assert.ok(Math.abs(slope - expected) <= 1e-4 * Math.max(1, Math.abs(expected)), `${what}: re-solve slope ${slope} vs shadow price ${expected}`);
        checked++;
      };
      r.nutrients.forEach((n, k) => {
        if (!n.binding || k >= p.nutrients.length) return;
        const h = 1e-6 * Math.max(1, Math.abs(n.value));
        const sign = n.binding === 'min' ? 1 : -1;
        diff((q) => {
          const nb = q.nutrients[k];
          if (n.binding === 'min') nb.min = nb.min! + sign * h;
          else nb.max = nb.max! + sign * h;
        }, sign * h, n.shadowPrice, `nutrient ${n.id} ${n.binding}`);
      });
      r.ratios.forEach((ra, k) => {
        if (!ra.binding) return;
        const h = 1e-7;
        const sign = ra.binding === 'min' ? 1 : -1;
        diff((q) => {
          const x = q.ratios[k];
          if (ra.binding === 'min') x.min = x.min! + sign * h;
          else x.max = x.max! + sign * h;
        }, sign * h, ra.shadowPrice, `ratio ${ra.id}`);
      });
      r.groups.forEach((g, k) => {
        if (!g.binding) return;
        const h = 1e-4;
        const sign = g.binding === 'min' ? 1 : -1;
        diff((q) => {
          const x = q.groups[k];
          if (g.binding === 'min') x.minKg = x.minKg! + sign * h;
          else x.maxKg = x.maxKg! + sign * h;
        }, sign * h, g.shadowPrice, `group ${g.id}`);
      });
      assert.ok(checked >= 3, `only ${checked} bounds checked`);
    });
  }

  test('price ranging: the mix holds inside the range and changes outside it; left-out ingredients enter below their price', () => {
    const p = broilerProblem(3);
    const r = opt(p);
    const mixOf = (x: OptimalResult) => new Map(x.mix.map((m) => [m.id, m.kg]));
    const same = (a: Map<string, number>, b: Map<string, number>) =>
      [...new Set([...a.keys(), ...b.keys()])].every((id) => Math.abs((a.get(id) ?? 0) - (b.get(id) ?? 0)) <= 1e-6 * p.batchKg);
    const base = mixOf(r);
    let inChecks = 0;
    let outChecks = 0;
    r.ranging.forEach((g, j) => {
      const at = (price: number) => {
        const q = structuredClone(p);
        q.ingredients[j].pricePerKg = price;
        return solveFormula(q);
      };
      if (g.inMix && !('fixed' in g) && g.highPrice !== null && g.lowPrice !== null) {
        const low = Math.max(0, g.lowPrice);
        const inside = at(low + 0.5 * (g.highPrice - low)) as OptimalResult;
        assert.ok(same(mixOf(inside), base), `${g.id}: mix changed inside its range`);
        const above = at(g.highPrice * 1.01 + 1e-4) as OptimalResult;
        assert.ok(!same(mixOf(above), base), `${g.id}: mix did not change above ${g.highPrice}`);
        inChecks++;
      }
      if (!g.inMix && g.entersAtPrice !== null && g.entersAtPrice > 0) {
        const below = at(g.entersAtPrice * 0.98) as OptimalResult;
        assert.ok((mixOf(below).get(g.id) ?? 0) > 0, `${g.id}: did not enter below ${g.entersAtPrice}`);
        const justAbove = at(g.entersAtPrice * 1.0001 + 1e-9) as OptimalResult;
        assert.ok((mixOf(justAbove).get(g.id) ?? 0) <= 1e-6 * p.batchKg, `${g.id}: entered above ${g.entersAtPrice}`);
        outChecks++;
      }
    });
    assert.ok(inChecks >= 3 && outChecks >= 3, `${inChecks} in-mix and ${outChecks} left-out ingredients checked`);
  });

  test('readable shadow price: cost per tonne per 0.1 % of a % nutrient', () => {
    const r = opt(broilerProblem(1));
    const lys = r.nutrients.find((n) => n.binding && n.unit === '%' && n.readable)!;
    assert.ok(lys.readable);
    assert.equal(lys.readable!.step, 0.1);
    assert.ok(Math.abs(lys.readable!.costPerTonne - lys.shadowPricePerTonne * 0.1) < 1e-9);
    assert.match(lys.readable!.text, /^Each 0\.1 % more .* (adds|saves) \d+\.\d\d per tonne of feed\.$/);
  });
});
