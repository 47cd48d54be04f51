/**
 * The insect meal value sentence: each place an ingredient can stand in a price sweep reads differently,
 * so "never enters" and "a minimum keeps it in" can no longer be mistaken for each other.
 */
import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { sweepSentence, type SweepUnits } from '../../src/screens/formulas/sweep-words';
import type { PriceSweepEntry, SweepPoint } from '../../src/shared/schemas/formulation';
import type { FormulaPriceSweep } from '../../src/shared/schemas/formulas';

const metric: SweepUnits = { priceOf: (v) => v, massText: (kg) => `${kg} kg`, currency: 'EUR', mass: 'kg' };
// 1 lb = 0.45359237 kg exactly (international yard and pound agreement, 1959).
const us: SweepUnits = { priceOf: (v) => v * 0.45359237, massText: (kg) => `${(kg / 0.45359237).toFixed(1)} lb`, currency: 'USD', mass: 'lb' };

function data(entry: PriceSweepEntry, currentKg: number | null = 0): FormulaPriceSweep {
  const point = (pricePerKg: number, kg: number | null): SweepPoint => ({ pricePerKg, status: kg === null ? 'infeasible' : 'optimal', costPerBatch: kg === null ? null : 300, kg, percent: kg === null ? null : kg / 10 });
  return {
    ingredientId: 7,
    ingredientName: 'Larvae meal',
    currentPricePerKg: 1.2,
    batchKg: 1000,
    sweep: { status: 'swept', ingredient: '7', fromPrice: 0, toPrice: 2.4, points: [point(0, 100), point(2.4, 0)], current: point(1.2, currentKg), entry, breakpoints: [] },
  };
}

describe('price sweep sentence', () => {
  test('enters within the range: left out today, or already in today', () => {
    assert.equal(sweepSentence(data({ kind: 'enters_in_range', price: 0.85 }), metric), 'Larvae meal enters the mix at 0.850 EUR per kg or less; today’s price is 1.200 EUR per kg, so it is left out today.');
    assert.equal(
      sweepSentence(data({ kind: 'enters_in_range', price: 1.5 }, 60), metric),
      'Larvae meal is already in the mix at today’s price of 1.200 EUR per kg. It stays in up to 1.500 EUR per kg; above that it is left out.',
    );
  });

  test('never in the range: says where it would enter, or that it would not even free, or that its limits keep it out', () => {
    assert.match(sweepSentence(data({ kind: 'never_in_range', entersAtPrice: 0.1 }, null), metric), /stays out of the mix at every price swept, from 0\.000 to 2\.400 EUR per kg\. It would enter at 0\.100 EUR per kg or less\./);
    assert.match(sweepSentence(data({ kind: 'never_in_range', entersAtPrice: -0.2 }), metric), /would not enter even free/);
    assert.match(sweepSentence(data({ kind: 'never_in_range', entersAtPrice: null }), metric), /limits or the specification keep it out at any price/);
  });

  test('kept in at any price: minimum, fixed amount or the specification, never read as "does not enter"', () => {
    const min = sweepSentence(data({ kind: 'always_in', reason: 'minimum', leastKg: 20, leastPercent: 2, risesAbovePrice: 0.6 }, 20), metric);
    assert.equal(min, 'Larvae meal is in the mix at any price: its minimum inclusion of 20 kg (2.00 % of the batch) keeps it in. More than that is used at 0.600 EUR per kg or less; today’s price is 1.200 EUR per kg.');
    assert.doesNotMatch(min, /stays out|does not enter/);
    assert.match(sweepSentence(data({ kind: 'always_in', reason: 'fixed', leastKg: 30, leastPercent: 3, risesAbovePrice: null }, 30), metric), /fixed amount of 30 kg .* keeps it in\. Its price cannot change how much is used\./);
    assert.match(sweepSentence(data({ kind: 'always_in', reason: 'required', leastKg: 3.8, leastPercent: 0.38, risesAbovePrice: 0.125 }, 3.8), metric), /specification cannot be met with less than 3\.8 kg/);
    assert.match(sweepSentence(data({ kind: 'in_throughout_range', leavesAbovePrice: 3 }, 80), metric), /in the mix at every price swept, from 0\.000 to 2\.400 EUR per kg; it is left out only above 3\.000 EUR per kg/);
  });

  test('no mix and a solver failure say so, with no price', () => {
    assert.match(sweepSentence(data({ kind: 'no_mix' }, null), metric), /No mix meets the specification at any price/);
    assert.match(sweepSentence(data({ kind: 'failed', message: 'x' }), metric), /could not be settled/);
  });

  test('in US units the prices read per lb', () => {
    // 0.85 per kg × 0.45359237 kg per lb = 0.3855535 per lb.
    assert.match(sweepSentence(data({ kind: 'enters_in_range', price: 0.85 }), us), /enters the mix at 0\.386 USD per lb or less/);
  });
});
