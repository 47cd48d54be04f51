/**
 * Price sweep ("what is insect meal worth"): warm re-solves agree with cold solves, and where the
 * ingredient stands (`entry`) is one explicit answer, each checked by re-solving with the price just
 * above and just below, with the engine's own solver and with HiGHS (an independent library). The
 * old result folded "never enters" and "a minimum keeps it in" into one null; these tests tell every
 * case apart.
 */
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { before, describe, test } from 'node:test';

import { getHighsSolver } from '../../../server/lp/highs-solver';
import { buildFormulaModel } from '../../../src/shared/engine/formula-model';
import { solveFormula } from '../../../src/shared/engine/formulate';
import type { LpSolver } from '../../../src/shared/engine/lp-types';
import { priceSweep } from '../../../src/shared/engine/price-sweep';
import { solveWithSimplexJs } from '../../../src/shared/engine/simplex-js';
import { formulaProblemSchema, type FormulaProblem, type OptimalResult, type PriceSweepEntry, type PriceSweepResult } from '../../../src/shared/schemas/formulation';
import { broilerProblem, suiteProblem } from './generate';

/** A price a hair above / below p (relative 1e-6): inside the same interval unless p is a breakpoint. */
const above = (p: number) => p + 1e-6 * Math.max(1, Math.abs(p));
const below = (p: number) => p - 1e-6 * Math.max(1, Math.abs(p));

function withPrice(problem: FormulaProblem, id: string, price: number): FormulaProblem {
  const q = structuredClone(problem);
  q.ingredients.find((i) => i.id === id)!.pricePerKg = price;
  return q;
}

/** kg of `id` in a cold solve by the engine at `price`. */
function engineKg(problem: FormulaProblem, id: string, price: number): number {
  const r = solveFormula(withPrice(problem, id, price));
  assert.equal(r.status, 'optimal', `solve at ${price}`);
  return (r as OptimalResult).mix.find((m) => m.id === id)?.kg ?? 0;
}

/** Share of `id` in a cold solve of the LP by the engine's solver at `price` (any sign: below 0 too). */
function engineShare(problem: FormulaProblem, id: string, price: number): number {
  const model = buildFormulaModel(problem);
  const j = problem.ingredients.findIndex((i) => i.id === id);
  const o = solveWithSimplexJs({ ...model.lp, colCost: model.lp.colCost.map((c, k) => (k === j ? price : c)) });
  assert.equal(o.status, 'optimal', `solve at ${price}`);
  return o.status === 'optimal' ? o.colValue[j] : NaN;
}

function sweep(problem: unknown, ingredient: string, fromPrice: number, toPrice: number, steps = 11): PriceSweepResult {
  const r = priceSweep({ problem, ingredient, fromPrice, toPrice, steps });
  assert.equal(r.status, 'swept', JSON.stringify(r).slice(0, 300));
  return r as PriceSweepResult;
}

function expectKind<K extends PriceSweepEntry['kind']>(r: PriceSweepResult, kind: K): Extract<PriceSweepEntry, { kind: K }> {
  assert.equal(r.entry.kind, kind, JSON.stringify(r.entry));
  return r.entry as Extract<PriceSweepEntry, { kind: K }>;
}

describe('price sweep', () => {
  let highs: LpSolver;
  before(async () => {
    highs = await getHighsSolver();
  });

  /** Share of the batch of `id` in HiGHS's optimum at `price`. */
  const highsShare = (problem: FormulaProblem, id: string, price: number) => {
    const model = buildFormulaModel(formulaProblemSchema.parse(problem));
    const j = problem.ingredients.findIndex((i) => i.id === id);
    const o = highs.solve({ ...model.lp, colCost: model.lp.colCost.map((c, k) => (k === j ? price : c)) });
    assert.equal(o.status, 'optimal', `HiGHS at ${price}`);
    return o.status === 'optimal' ? o.colValue[j] : NaN;
  };
  /** The least (sign 1) or most (sign -1) share of `id` any mix meeting the bounds can hold, by HiGHS. */
  const highsExtreme = (problem: FormulaProblem, id: string, sign: 1 | -1) => {
    const model = buildFormulaModel(formulaProblemSchema.parse(problem));
    const j = problem.ingredients.findIndex((i) => i.id === id);
    const o = highs.solve({ ...model.lp, colCost: model.lp.colCost.map((_, k) => (k === j ? sign : 0)) });
    return o.status === 'optimal' ? o.colValue[j] : null;
  };

  test('insect meal: points match cold solves; the entering price matches ranging and re-solves either side', () => {
    const problem = broilerProblem(2);
    const id = 'bsf-defatted';
    const r = sweep(problem, id, 0.2, 1.6, 15);
    for (const pt of r.points) {
      const cold = solveFormula(withPrice(problem, id, pt.pricePerKg)) as OptimalResult;
      assert.ok(Math.abs(cold.costPerBatch - (pt.costPerBatch as number)) <= 1e-6 * cold.costPerBatch, `cost at ${pt.pricePerKg}`);
    }
    // Inclusion never rises with the ingredient's own price.
    for (let k = 1; k < r.points.length; k++) assert.ok((r.points[k].kg as number) <= (r.points[k - 1].kg as number) + 1e-6);
    const { price } = expectKind(r, 'enters_in_range');
    assert.ok(price > 0.2 && price < 1.6);
    const out = solveFormula(withPrice(problem, id, price * 1.001 + 1e-9)) as OptimalResult;
    const rg = out.ranging.find((x) => x.id === id)!;
    assert.equal(rg.inMix, false);
    if (!rg.inMix) assert.ok(Math.abs((rg.entersAtPrice as number) - price) < 1e-6);
    assert.ok(engineKg(problem, id, above(price)) <= 1e-6, 'left out just above');
    assert.ok(engineKg(problem, id, below(price)) > 1e-3, 'used just below');
    assert.ok(highsShare(problem, id, above(price)) <= 1e-9, 'HiGHS: left out just above');
    assert.ok(highsShare(problem, id, below(price)) > 1e-6, 'HiGHS: used just below');
    for (const b of r.breakpoints) assert.ok(b > 0.2 && b < 1.6);
    // Today's price as given in the problem, solved like any other point.
    const today = problem.ingredients.find((i) => i.id === id)!.pricePerKg;
    assert.equal(r.current.pricePerKg, today);
    assert.ok(Math.abs((r.current.kg as number) - engineKg(problem, id, today)) <= 1e-6);
  });

  test('the same price is reported whichever side of the range it falls: left out throughout, or in throughout', () => {
    const problem = broilerProblem(2);
    const id = 'bsf-defatted';
    const { price } = expectKind(sweep(problem, id, 0.2, 1.6), 'enters_in_range');
    // A range entirely above that price: left out at every price swept, and it says where it would enter.
    const high = sweep(problem, id, price + 0.2, price + 1);
    const never = expectKind(high, 'never_in_range');
    assert.ok(never.entersAtPrice !== null && Math.abs(never.entersAtPrice - price) <= 1e-9 * Math.max(1, price), `${never.entersAtPrice} vs ${price}`);
    assert.ok(high.points.every((p) => (p.kg as number) <= 1e-6));
    // A range entirely below it: used at every price swept, and it says where it would leave.
    const low = sweep(problem, id, 0, price - 0.1);
    const throughout = expectKind(low, 'in_throughout_range');
    assert.ok(Math.abs(throughout.leavesAbovePrice - price) <= 1e-9 * Math.max(1, price), `${throughout.leavesAbovePrice} vs ${price}`);
    assert.ok(low.points.every((p) => (p.kg as number) > 1e-3));
  });

  test('a minimum inclusion keeps it in at any price: not "never enters"; it rises above the minimum at the price found', () => {
    const problem = broilerProblem(2);
    const id = 'bsf-defatted';
    const q = structuredClone(problem);
    q.ingredients.find((i) => i.id === id)!.minPercent = 2;
    const r = sweep(q, id, 0.2, 1.6);
    const e = expectKind(r, 'always_in');
    assert.equal(e.reason, 'minimum');
    assert.ok(Math.abs(e.leastKg - 20) <= 1e-6 && Math.abs(e.leastPercent - 2) <= 1e-9, '2 % of a 1,000 kg batch');
    assert.ok(r.points.every((p) => (p.kg as number) >= 20 - 1e-6));
    assert.ok(e.risesAbovePrice !== null);
    const p = e.risesAbovePrice!;
    assert.ok(Math.abs(engineKg(q, id, above(p)) - 20) <= 1e-6, 'at its minimum just above');
    assert.ok(engineKg(q, id, below(p)) > 20 + 1e-3, 'above its minimum just below');
    assert.ok(Math.abs(highsShare(q, id, above(p)) - 0.02) <= 1e-9, 'HiGHS: at its minimum just above');
    assert.ok(highsShare(q, id, below(p)) > 0.02 + 1e-6, 'HiGHS: above its minimum just below');
  });

  test('kept out by its limits (maximum 0) is told apart from a minimum, and from a fixed amount', () => {
    const problem = broilerProblem(2);
    const id = 'bsf-defatted';
    const none = structuredClone(problem);
    none.ingredients.find((i) => i.id === id)!.maxKg = 0;
    assert.deepEqual(expectKind(sweep(none, id, 0, 1.6), 'never_in_range'), { kind: 'never_in_range', entersAtPrice: null });
    assert.equal(highsExtreme(none, id, -1), 0, 'HiGHS: no mix can hold any');

    const fixed = structuredClone(problem);
    fixed.ingredients.find((i) => i.id === id)!.fixedKg = 30;
    const r = sweep(fixed, id, 0, 1.6);
    const e = expectKind(r, 'always_in');
    assert.equal(e.reason, 'fixed');
    assert.equal(e.risesAbovePrice, null, 'its price cannot change a fixed amount');
    assert.ok(Math.abs(e.leastKg - 30) <= 1e-6);
    assert.ok(r.points.every((p) => Math.abs((p.kg as number) - 30) <= 1e-6));
  });

  test('needed by the specification (the only sodium source): always in at the least amount that meets sodium', () => {
    // Salt, NaCl: Na 39.34 % (domain reference, ingredient table, [D]: pure compound). The sodium minimum
    // 0.15 % (a round bound, common practice) needs 1000 × 0.15 / 39.34 = 3.8129 kg of salt per tonne.
    const problem: FormulaProblem = formulaProblemSchema.parse({
      batchKg: 1000,
      ingredients: [
        { id: 'grain', pricePerKg: 0.2, nutrients: { cp: 9 } },
        { id: 'meal', pricePerKg: 0.5, nutrients: { cp: 45 } },
        { id: 'salt', pricePerKg: 0.1, nutrients: { na: 39.34 } },
      ],
      nutrients: [
        { id: 'cp', unit: '%', min: 18 },
        { id: 'na', unit: '%', min: 0.15, max: 0.25 },
      ],
    });
    const r = sweep(problem, 'salt', 0, 5);
    const e = expectKind(r, 'always_in');
    assert.equal(e.reason, 'required');
    assert.ok(Math.abs(e.leastKg - (1000 * 0.15) / 39.34) <= 1e-6, `least ${e.leastKg} kg`);
    assert.ok(Math.abs(e.leastKg / 1000 - highsExtreme(problem, 'salt', 1)!) <= 1e-9, 'HiGHS agrees on the least');
    // Each kg of salt takes the place of a kg of the grain and meal mix but brings no protein, so 9/36 kg of grain
    // must turn into meal to hold 18 %: it saves 0.2 − 0.3 × 9/36 = 0.125 per kg (hand arithmetic). Cheaper than that,
    // salt fills sodium up to its 0.25 % maximum; dearer, it stays at what sodium needs.
    assert.ok(e.risesAbovePrice !== null && Math.abs(e.risesAbovePrice - 0.125) <= 1e-7, `rises above its least at ${e.risesAbovePrice}`);
    assert.ok(Math.abs(engineKg(problem, 'salt', above(0.125)) - e.leastKg) <= 1e-6);
    assert.ok(Math.abs(engineKg(problem, 'salt', below(0.125)) - (1000 * 0.25) / 39.34) <= 1e-6, 'sodium at its maximum just below');
    assert.ok(Math.abs(highsShare(problem, 'salt', below(0.125)) - 0.25 / 39.34) <= 1e-9, 'HiGHS: sodium at its maximum just below');
  });

  test('worked three-feed blend: limestone stops being a cheap filler at 30.5 − 59.5 × 0.09 / 0.41 cents per kg', () => {
    // Data: domain reference §5, worked example 5 [V] (tests/fixtures/lp/three-feed-ca-band.json). With protein
    // binding at 22 %, each kg of limestone displaces corn and soybean meal at a net 30.5 − 59.5 × 0.09 / 0.41
    // = 17.4390 cents (hand arithmetic on that data): cheaper, it fills calcium to its 1.2 % max; dearer, down to 0.8 %.
    const fixture = JSON.parse(readFileSync(join(__dirname, '../../fixtures/lp/three-feed-ca-band.json'), 'utf8'));
    const problem = formulaProblemSchema.parse(fixture.problem);
    const r = sweep(problem, 'limestone', 0, 30, 31);
    const swap = 30.5 - (59.5 * 0.09) / 0.41;
    assert.ok(r.breakpoints.some((b) => Math.abs(b - swap) <= 1e-6), `breakpoints ${r.breakpoints.join(', ')} include ${swap}`);
    // At its own price (10 cents) the mix is the worked example's optimum: limestone 0.028171 kg per kg [D].
    assert.ok(Math.abs((r.current.kg as number) - 0.028171) <= 1e-6);
    // Calcium needs some limestone at any price: the least any mix can hold, by HiGHS.
    const e = expectKind(r, 'always_in');
    assert.equal(e.reason, 'required');
    assert.ok(Math.abs(e.leastKg - highsExtreme(problem, 'limestone', 1)!) <= 1e-9, `least ${e.leastKg}`);
    assert.ok(e.risesAbovePrice !== null && e.risesAbovePrice > 30, 'above its least only at a price far above the range');
    const p = e.risesAbovePrice!;
    assert.ok(Math.abs(highsShare(problem, 'limestone', above(p)) - e.leastKg) <= 1e-9, 'HiGHS: at its least just above');
    assert.ok(highsShare(problem, 'limestone', below(p)) > e.leastKg + 1e-7, 'HiGHS: above its least just below');
  });

  test('no mix at any price says so, with no price', () => {
    const problem = broilerProblem(2);
    Object.assign(problem.nutrients.find((n) => n.id === 'cp')!, { min: 60, max: undefined });
    const r = sweep(problem, 'bsf-defatted', 0, 1.6);
    assert.deepEqual(r.entry, { kind: 'no_mix' });
    assert.ok(r.points.every((p) => p.status === 'infeasible' && p.kg === null));
  });

  test('generated rations: every entry agrees with HiGHS (least and most it can hold, left out or at its least just above the price, more just below)', () => {
    const counts: Record<string, number> = {};
    let checked = 0;
    for (let i = 0; i < 40; i++) {
      const { problem: raw } = suiteProblem(i);
      const problem = formulaProblemSchema.parse(raw);
      for (const ing of problem.ingredients) {
        const id = ing.id;
        const label = `#${i} ${id}`;
        const r = sweep(problem, id, 0, 2, 3);
        const e = r.entry;
        counts[e.kind] = (counts[e.kind] ?? 0) + 1;
        const least = highsExtreme(problem, id, 1);
        if (e.kind === 'no_mix') {
          assert.equal(least, null, `${label}: HiGHS finds a mix`);
          continue;
        }
        assert.notEqual(e.kind, 'failed', `${label}: ${JSON.stringify(e)}`);
        assert.ok(least !== null, `${label}: HiGHS finds no mix`);
        const most = highsExtreme(problem, id, -1)!;
        const B = problem.batchKg;
        const floor = e.kind === 'always_in' ? e.leastKg / B : 0;
        assert.ok(Math.abs(floor - least) <= 1e-7, `${label}: least share ${floor} vs HiGHS ${least}`);
        let price: number | null = null;
        if (e.kind === 'enters_in_range') price = e.price;
        else if (e.kind === 'in_throughout_range') price = e.leavesAbovePrice;
        else if (e.kind === 'never_in_range') price = e.entersAtPrice;
        else if (e.kind === 'always_in') price = e.risesAbovePrice;
        if (e.kind === 'enters_in_range') assert.ok(e.price >= 0 && e.price <= 2, label);
        if (e.kind === 'in_throughout_range') assert.ok(e.leavesAbovePrice > 2, label);
        if (e.kind === 'never_in_range' && e.entersAtPrice !== null) assert.ok(e.entersAtPrice < 0, label);
        if (price === null) {
          assert.ok(most - least <= 1e-7, `${label}: no price moves it, yet HiGHS can hold ${least} to ${most}`);
          continue;
        }
        // The engine counts a change under 1 g per tonne (a share of 1e-6) as none. Inclusion never rises with the
        // price, so at any price above the one found the ingredient must be at its least, and at any below use more.
        // A solver keeps a mix while another is cheaper by less than its tolerance, so each is asked far enough either
        // side for the two mixes to differ in cost by more than that: javascript-lp-solver (precision 1e-8) by 1e-7
        // per kg of feed, HiGHS (optimality tolerance 1e-7) by 1e-6, never nearer than 1e-6 of the price.
        const step = engineShare(problem, id, price - 1e-3 * Math.max(1, Math.abs(price))) - floor;
        assert.ok(step > 1e-6, `${label}: the engine uses no more than its least below ${price}`);
        const near = Math.max(1e-6 * Math.max(1, Math.abs(price)), 1e-7 / step);
        assert.ok(engineShare(problem, id, price + near) <= floor + 1e-6, `${label}: re-solve uses more than its least at ${price} + ${near}`);
        assert.ok(engineShare(problem, id, price - near) > floor + 1e-6, `${label}: re-solve uses no more than its least at ${price} − ${near}`);
        const apart = Math.max(1e-5 * Math.max(1, Math.abs(price)), 1e-6 / step);
        assert.ok(highsShare(problem, id, price + apart) <= floor + 1e-6, `${label}: HiGHS uses more than its least at ${price} + ${apart}`);
        assert.ok(highsShare(problem, id, price - apart) > floor + 1e-6, `${label}: HiGHS uses no more than its least at ${price} − ${apart}`);
        checked++;
      }
    }
    assert.ok(checked > 100, `${checked} prices checked`);
    // The suite covers each kind the formulas can give.
    for (const kind of ['enters_in_range', 'in_throughout_range', 'never_in_range', 'always_in', 'no_mix']) assert.ok((counts[kind] ?? 0) > 0, `${kind}: ${JSON.stringify(counts)}`);
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
    const result = sweep(problem, 'insect', 0.1, 1.5, 8);
    for (let i = 1; i < result.breakpoints.length; i++) assert.ok(result.breakpoints[i] > result.breakpoints[i - 1], `breakpoints ${result.breakpoints.join(', ')}`);
    const { price } = expectKind(result, 'enters_in_range');
    assert.ok(price > 0.45 && price < 0.6, `enters at ${price}`);
    const p = formulaProblemSchema.parse(problem);
    assert.ok(engineKg(p, 'insect', above(price)) <= 1e-6 && engineKg(p, 'insect', below(price)) > 1e-3, 're-solved either side');
  });
});
