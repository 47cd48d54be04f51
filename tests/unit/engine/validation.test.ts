/**
 * Bad input gets a clear error naming the field; nothing throws, nothing hangs.
 */
import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { allocate } from '../../../src/shared/engine/allocate';
import { evaluateMix } from '../../../src/shared/engine/evaluate';
import { solveFormula } from '../../../src/shared/engine/formulate';
import { priceSweep } from '../../../src/shared/engine/price-sweep';

const base = () => ({
  batchKg: 1000,
  ingredients: [
    { id: 'corn', pricePerKg: 0.25, nutrients: { cp: 8.5, ca: 0.02, avp: 0.08 } },
    { id: 'soy', pricePerKg: 0.45, nutrients: { cp: 46, ca: 0.3, avp: 0.25 } },
    { id: 'lime', pricePerKg: 0.05, nutrients: { ca: 38 } },
  ],
  nutrients: [{ id: 'cp', min: 18 }],
});

function fieldsOf(r: { status: string; errors?: { field: string; message: string }[] }) {
  assert.equal(r.status, 'invalid', JSON.stringify(r).slice(0, 300));
  return (r.errors ?? []).map((e) => e.field);
}

describe('input validation', () => {
  test('unknown nutrient id in a ratio names ratios[i].numerator', () => {
    const p = { ...base(), ratios: [{ numerator: 'ca', denominator: 'avp', min: 1.8 }, { numerator: 'phytase', denominator: 'cp', min: 1 }] };
    assert.deepEqual(fieldsOf(solveFormula(p)), ['ratios[1].numerator']);
  });
  test('min above max names the bound', () => {
    const p = { ...base(), nutrients: [{ id: 'cp', min: 24, max: 18 }] };
    const r = solveFormula(p);
    assert.deepEqual(fieldsOf(r), ['nutrients[0].min']);
    assert.match(r.status === 'invalid' ? r.message : '', /min 24 is above max 18/);
  });
  test('negative price', () => {
    const p = base();
    p.ingredients[1].pricePerKg = -1;
    assert.deepEqual(fieldsOf(solveFormula(p)), ['ingredients[1].pricePerKg']);
  });
  test('NaN and Infinity are refused', () => {
    const p = base();
    p.ingredients[0].nutrients.cp = NaN;
    assert.deepEqual(fieldsOf(solveFormula(p)), ['ingredients[0].nutrients.cp']);
    assert.deepEqual(fieldsOf(solveFormula({ ...base(), batchKg: Infinity })), ['batchKg']);
  });
  test('a batch of zero', () => {
    const r = solveFormula({ ...base(), batchKg: 0 });
    assert.deepEqual(fieldsOf(r), ['batchKg']);
  });
  test('10,000 ingredients are refused quickly with the limit named', () => {
    const many = Array.from({ length: 10000 }, (_, i) => ({ id: `i${i}`, pricePerKg: 1, nutrients: { cp: i % 50 } }));
    const t = performance.now();
    const r = solveFormula({ ...base(), ingredients: many });
    assert.ok(performance.now() - t < 2000);
    assert.deepEqual(fieldsOf(r), ['ingredients']);
    assert.match(r.status === 'invalid' ? r.message : '', /at most 2000 ingredients/);
  });
  test('a misspelt key is an error, not silently ignored', () => {
    const p = { ...base(), nutrients: [{ id: 'fat', Max: 5 }] };
    assert.deepEqual(fieldsOf(solveFormula(p)), ['nutrients[0]']);
  });
  test('group members and duplicate ids are checked', () => {
    const p = { ...base(), groups: [{ id: 'insect', members: ['bsf'], maxKg: 120 }] };
    assert.deepEqual(fieldsOf(solveFormula(p)), ['groups[0].members[0]']);
    const q = base();
    q.ingredients.push({ ...q.ingredients[0] });
    assert.deepEqual(fieldsOf(solveFormula(q)), ['ingredients[3].id']);
  });
  test('fixedKg with maxKg is a contradiction', () => {
    const p = base();
    Object.assign(p.ingredients[0], { fixedKg: 100, maxKg: 200 });
    assert.deepEqual(fieldsOf(solveFormula(p)), ['ingredients[0].maxKg']);
  });
  test('non-objects, null and garbage never throw', () => {
    for (const junk of [null, undefined, 42, 'x', [], {}, { batchKg: '1000' }, { ingredients: null }]) {
      assert.equal(solveFormula(junk).status, 'invalid');
      assert.equal(evaluateMix(junk).status, 'invalid');
      assert.equal(allocate(junk).status, 'invalid');
      assert.equal(priceSweep(junk).status, 'invalid');
    }
  });
  test('evaluation, allocation and sweep name their own fields', () => {
    assert.deepEqual(fieldsOf(evaluateMix({ ...base(), mix: [{ id: 'oats', kg: 10 }] })), ['mix[0].id']);
    assert.deepEqual(fieldsOf(allocate({ ingredients: base().ingredients, formulas: [{ id: 'a', batchKg: 100, ingredients: [{ id: 'oats' }], nutrients: [] }] })), ['formulas[0].ingredients[0].id']);
    assert.deepEqual(fieldsOf(priceSweep({ problem: base(), ingredient: 'soy', fromPrice: 1, toPrice: 0.5 })), ['toPrice']);
  });
});
