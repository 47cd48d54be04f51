import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { checkRation, correct, type RationLine, type Requirement } from '../../src/shared/ration-check';

const close = (actual: number, expected: number, tol: number, what: string) => assert.ok(Math.abs(actual - expected) <= tol, `${what}: ${actual} is not within ${tol} of ${expected}`);

// Requirement: NRC (1994) Nutrient Requirements of Poultry, broiler starter 0–3 weeks, total lysine
// 1.10 % and methionine 0.50 % of the diet (as-fed), read in the broiler requirement table as adapted in
// the Merck Veterinary Manual, "Nutrient Requirements of Broilers".
const STARTER: Requirement = {
  name: 'Broiler starter, 0–3 weeks',
  source: 'NRC 1994, broiler requirement table',
  bounds: [
    { nutrientId: 'lys', name: 'Lysine', unit: '%', min: 1.1, max: null },
    { nutrientId: 'met', name: 'Methionine', unit: '%', min: 0.5, max: null },
  ],
  ratios: [],
};

// A hand-made farm mix. The ingredient values are inputs typed by the farmer (typical values recalled
// from memory, not check values); every expected number below is arithmetic on them.
const mix = (maizeKg: number, soyKg: number): RationLine[] => [
  { key: 'maize', name: 'Maize', kg: maizeKg, pricePerKg: 0.229, values: { lys: 0.26, met: 0.18 } },
  { key: 'soy', name: 'Soybean meal', kg: soyKg, pricePerKg: 0.512, values: { lys: 2.96, met: 0.67 } },
];

describe('ration check', () => {
  test('finds the lysine shortfall of a 700 kg maize + 300 kg soybean meal mix', () => {
    const r = checkRation(mix(700, 300), STARTER, { currency: 'EUR' });
    // Lysine: (700 × 0.26 + 300 × 2.96) / 1000 = 1.07 %, 0.03 below 1.10 %.
    const lys = r.findings.find((f) => f.id === 'lys')!;
    assert.equal(lys.kind, 'short');
    close(lys.value!, 1.07, 1e-9, 'lysine level');
    close(lys.by, 0.03, 1e-9, 'lysine shortfall');
    assert.match(lys.text, /Lysine is short: 1\.07 % in your mix, at least 1\.10 % needed \(short by 0\.030 %\)/);
    // Methionine: (700 × 0.18 + 300 × 0.67) / 1000 = 0.327 %, short of 0.50 %.
    const met = r.findings.find((f) => f.id === 'met')!;
    assert.equal(met.kind, 'short');
    close(met.value!, 0.327, 1e-9, 'methionine level');
    assert.equal(r.meetsRequirement, false);
    // Cost: (700 × 0.229 + 300 × 0.512) / 1000 = 0.3139 per kg.
    close(r.costPerKg!, 0.3139, 1e-12, 'cost per kg');
    assert.ok(r.summary.some((s) => s.includes('0.3139 EUR per kg')));
  });

  test('a mix that meets the requirement says so and proposes nothing', () => {
    const r = checkRation(mix(600, 400), { ...STARTER, bounds: [STARTER.bounds[0]] });
    // (600 × 0.26 + 400 × 2.96) / 1000 = 1.34 % ≥ 1.10 %.
    assert.equal(r.meetsRequirement, true);
    assert.equal(r.corrections.length, 0);
  });

  test('rebalancing with the same total finds the least soybean meal that meets lysine', () => {
    const lysOnly = { ...STARTER, bounds: [STARTER.bounds[0]] };
    const c = correct(mix(700, 300), lysOnly, 'rebalance');
    assert.equal(c.status, 'found');
    if (c.status !== 'found') return;
    // 0.26 (1 − x) + 2.96 x = 1.10 → x = 0.84 / 2.70: 311.11 kg soybean meal in 1,000 kg.
    close(c.lines.find((l) => l.key === 'soy')!.newKg, (1000 * 0.84) / 2.7, 1e-4, 'soybean meal');
    close(c.batchKg, 1000, 1e-9, 'batch');
  });

  test('adding only from their own ingredients keeps every kg they mix and meets lysine', () => {
    const lysOnly = { ...STARTER, bounds: [STARTER.bounds[0]] };
    const c = correct(mix(700, 300), lysOnly, 'add');
    assert.equal(c.status, 'found');
    if (c.status !== 'found') return;
    for (const l of c.lines) assert.ok(l.newKg >= l.currentKg - 1e-6, `${l.name} was reduced`);
    const maize = c.lines.find((l) => l.key === 'maize')!.newKg;
    const soy = c.lines.find((l) => l.key === 'soy')!.newKg;
    // The corrected mix, recomputed by hand: lysine at least 1.10 %.
    assert.ok((maize * 0.26 + soy * 2.96) / (maize + soy) >= 1.1 - 1e-7);
    assert.match(c.text[0], /add .* of Soybean meal/);
  });

  test('an ingredient with no value for a nutrient is named; an unpriced one blocks the correction', () => {
    const lines: RationLine[] = [...mix(700, 300), { key: 'bran', name: 'Wheat bran', kg: 50, pricePerKg: null, values: { lys: 0.6 } }];
    const r = checkRation(lines, STARTER);
    assert.deepEqual(r.findings.find((f) => f.id === 'met')!.missingIn, ['Wheat bran']);
    assert.equal(r.costPerKg, null);
    assert.ok(r.corrections.every((c) => c.status === 'none' && /price for Wheat bran/.test(c.text[0])));
  });

  test('when their ingredients cannot meet it, the answer says so instead of hiding it', () => {
    // Maize alone: no amount of it reaches 1.10 % lysine.
    const r = checkRation([{ key: 'maize', name: 'Maize', kg: 500, pricePerKg: 0.229, values: { lys: 0.26, met: 0.18 } }], STARTER);
    assert.ok(r.corrections.every((c) => c.status === 'none'));
    assert.match(r.corrections[0].text.join(' '), /cannot fix it/);
  });

  test('US units: amounts in lb in the words', () => {
    const r = checkRation(mix(700, 300), { ...STARTER, bounds: [STARTER.bounds[0]] }, { system: 'us', currency: 'USD' });
    // 1000 kg = 1000 / 0.45359237 lb = 2204.6 lb; 0.3139 per kg × 0.45359237 = 0.1424 per lb.
    assert.match(r.summary[0], /2205 lb/);
    assert.ok(r.summary.some((s) => s.includes('0.1424 USD per lb')));
  });
});
