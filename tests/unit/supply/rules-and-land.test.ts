import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { LOCAL_RULES_NOTE, mealOfferedTo, mealRefusedFamilies, plannedMealForRule, soybeanAreaForProtein, substrateFlags } from '../../../src/shared/supply';

describe('substrate flags (feed law; local regulations decide)', () => {
  // EU: catering waste is prohibited for farmed animals (Reg. (EC) 1069/2009); manure is a category 2 material;
  // only a closed list of animal products may be fed to insects (Reg. (EU) 2017/893). US: AAFCO T60.117(C) requires
  // feed-grade feedstock.
  const flags = substrateFlags([
    { name: 'Town brewery grains', substrate: 'brewery_grains' },
    { name: 'Market vegetables', substrate: 'fruit_vegetable_waste' },
    { name: 'Canteen waste', substrate: 'food_waste' },
    { name: 'Layer manure', substrate: 'manure' },
    { name: 'Abattoir trimmings', substrate: 'slaughter_by_products' },
  ]);
  const byName = (name: string) => flags.find((f) => f.streamName === name);

  test('manure and catering waste are flagged as not allowed in the EU', () => {
    assert.deepEqual(byName('Layer manure')!.notAllowed.map((n) => n.jurisdiction), ['EU', 'US']);
    assert.deepEqual(byName('Canteen waste')!.notAllowed.map((n) => n.jurisdiction), ['EU', 'US']);
    assert.match(byName('Canteen waste')!.notAllowed[0].text, /Catering and kitchen waste/);
    assert.ok(byName('Abattoir trimmings')!.notAllowed.length > 0);
  });

  test('brewery grains and vegetable waste are not flagged, only conditioned', () => {
    assert.equal(byName('Town brewery grains')!.notAllowed.length, 0);
    assert.equal(byName('Market vegetables')!.notAllowed.length, 0);
    assert.ok(byName('Market vegetables')!.conditions.some((n) => n.jurisdiction === 'EU'));
  });

  test('every note names its source and the plain note says local rules decide', () => {
    for (const f of flags) for (const n of [...f.notAllowed, ...f.conditions]) assert.ok(n.source.length > 5);
    assert.match(LOCAL_RULES_NOTE, /local regulations decide/);
  });
});

describe('the species rule on the planned meal', () => {
  test('larvae reared on chicken slaughter by-products are never offered to poultry, and are to pigs', () => {
    const meal = plannedMealForRule('Our meal', [
      { substrate: 'brewery_grains' },
      { substrate: 'slaughter_by_products', animals: ['chicken'] },
    ]);
    assert.equal(meal.substrateOrigin, 'mixed');
    assert.deepEqual(mealRefusedFamilies(meal), ['poultry']);
    const verdict = mealOfferedTo(meal, 'poultry', 'Broiler chicken');
    assert.equal(verdict.allowed, false);
    if (!verdict.allowed) assert.match(verdict.message, /Broiler chicken/);
    assert.equal(mealOfferedTo(meal, 'swine').allowed, true);
  });

  test('pig manure blocks pig diets; plant substrates block nothing', () => {
    assert.deepEqual(mealRefusedFamilies(plannedMealForRule('M', [{ substrate: 'manure', animals: ['pig'] }])), ['swine']);
    const plant = plannedMealForRule('M', [{ substrate: 'brewery_grains' }, { substrate: 'fruit_vegetable_waste' }]);
    assert.equal(plant.substrateOrigin, 'plant');
    assert.deepEqual(mealRefusedFamilies(plant), []);
  });

  test('a stream of 0 t/week does not count, and the default animals of a substrate apply', () => {
    const meal = plannedMealForRule('M', [{ substrate: 'brewery_grains', tonnesPerWeek: 3 }, { substrate: 'manure', tonnesPerWeek: 0 }]);
    assert.deepEqual(mealRefusedFamilies(meal), []);
    assert.deepEqual(mealRefusedFamilies(plannedMealForRule('M', [{ substrate: 'manure' }])), ['poultry']);
  });
});

describe('land use: soybean area for the same crude protein', () => {
  test('hand check: 100 kg CP a week for 52 weeks against 2.8 t/ha at 37 % CP (arithmetic)', () => {
    // 5.2 t CP a year ÷ (2.8 × 0.37 = 1.036 t CP/ha) = 5.0193 ha.
    const r = soybeanAreaForProtein({ mealProteinKgPerWeek: 100, soybeanYieldTPerHa: 2.8, soybeanCpPct: 37 });
    assert.ok(Math.abs(r.mealProteinTPerYear - 5.2) < 1e-12);
    assert.ok(Math.abs(r.soybeanProteinTPerHa - 1.036) < 1e-12);
    assert.ok(Math.abs(r.soybeanHa - 5.0193) < 1e-4);
  });

  test('area falls as the yield rises, in proportion', () => {
    const low = soybeanAreaForProtein({ mealProteinKgPerWeek: 250, soybeanYieldTPerHa: 2 });
    const high = soybeanAreaForProtein({ mealProteinKgPerWeek: 250, soybeanYieldTPerHa: 4 });
    assert.ok(Math.abs(low.soybeanHa / high.soybeanHa - 2) < 1e-12);
  });

  test('a yield of 0 is refused with a message', () => {
    assert.throws(() => soybeanAreaForProtein({ mealProteinKgPerWeek: 1, soybeanYieldTPerHa: 0 }), /soybean yield must be above 0/);
  });
});
