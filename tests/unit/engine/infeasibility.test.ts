/**
 * Infeasibility explained in words, with the amount each bound must move.
 */
import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { solveFormula } from '../../../src/shared/engine/formulate';

describe('infeasibility diagnosis', () => {
  // Hand check: with soybean meal capped at 30 %, the richest mix is 70 % corn + 30 % SBM:
  // 0.7 × 8.5 + 0.3 × 44 = 19.15 % CP (arithmetic by hand; composition values are common practice).
  test('crude protein min that cannot be met: names the bound and the level the closest mix reaches', () => {
    const r = solveFormula({
      batchKg: 1000,
      ingredients: [
        { id: 'corn', pricePerKg: 0.25, nutrients: { cp: 8.5 } },
        { id: 'sbm', name: 'soybean meal', pricePerKg: 0.45, maxPercent: 30, nutrients: { cp: 44 } },
      ],
      nutrients: [{ id: 'cp', name: 'crude protein', unit: '%', min: 24 }],
    });
    assert.equal(r.status, 'infeasible');
    if (r.status !== 'infeasible') return;
    // Penalties are relative: moving the CP min by 4.85 (20 %) costs less than moving the 300 kg cap by 426 kg.
    assert.equal(r.relaxations.length, 1);
    const x = r.relaxations[0];
    assert.equal(x.constraint, 'nutrients[cp].min');
    assert.ok(Math.abs(x.reaches - 19.15) < 1e-6, String(x.reaches));
    assert.ok(Math.abs(x.by - 4.85) < 1e-6);
    assert.equal(x.message, 'crude protein min 24 % cannot be met with these ingredients; the closest mix reaches 19.15 %');
    assert.ok(r.conflict.includes('ingredients[sbm].maxPercent'), JSON.stringify(r.conflict));
    assert.ok(r.closestMix && Math.abs(r.closestMix.mix.find((m) => m.id === 'sbm')!.kg - 300) < 1e-6);
  });

  test('a fat ceiling and a fibre ceiling are ordinary max bounds: the fibre ceiling conflict is reported', () => {
    const r = solveFormula({
      batchKg: 100,
      ingredients: [
        { id: 'barley', pricePerKg: 0.2, nutrients: { fibre: 5, fat: 2 } },
        { id: 'oats', pricePerKg: 0.22, nutrients: { fibre: 10, fat: 5 } },
      ],
      nutrients: [
        { id: 'fat', unit: '%', max: 4 },
        { id: 'fibre', unit: '%', max: 4 },
      ],
    });
    assert.equal(r.status, 'infeasible');
    if (r.status !== 'infeasible') return;
    assert.equal(r.relaxations[0].constraint, 'nutrients[fibre].max');
    assert.ok(Math.abs(r.relaxations[0].reaches - 5) < 1e-6);
    assert.match(r.message, /fibre max 4 % cannot be kept with these ingredients; the closest mix has 5 %/);
  });

  test('ingredient minimums above the batch are explained, not crashed on', () => {
    const r = solveFormula({
      batchKg: 100,
      ingredients: [
        { id: 'a', pricePerKg: 1, minKg: 70, nutrients: {} },
        { id: 'b', pricePerKg: 1, minKg: 50, nutrients: {} },
      ],
    });
    assert.equal(r.status, 'infeasible');
    if (r.status !== 'infeasible') return;
    const moved = r.relaxations.reduce((s, x) => s + x.by, 0);
    assert.ok(Math.abs(moved - 20) < 1e-6, JSON.stringify(r.relaxations));
  });

  test('a ratio that cannot be met: Ca : available P with a phosphorus source that is too rich', () => {
    const r = solveFormula({
      batchKg: 1000,
      ingredients: [
        { id: 'grain', pricePerKg: 0.2, nutrients: { ca: 0.05, avp: 0.3 } },
        { id: 'phosphate', pricePerKg: 0.6, nutrients: { ca: 16, avp: 21 } },
      ],
      nutrients: [{ id: 'avp', min: 0.4 }],
      ratios: [{ id: 'ca:avp', numerator: 'ca', denominator: 'avp', min: 1.8, max: 2.2 }],
    });
    assert.equal(r.status, 'infeasible');
    if (r.status !== 'infeasible') return;
    assert.ok(r.relaxations.some((x) => x.constraint === 'ratios[ca:avp].min'), JSON.stringify(r.relaxations));
  });
});
