/**
 * Published worked examples of ration formulation, reproduced by the engine. Each case
 * lives in tests/fixtures/lp/<name>.json with its source; the numbers checked are the
 * published ones, rounded as published.
 */
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, test } from 'node:test';

import { solveFormula } from '../../../src/shared/engine/formulate';
import type { OptimalResult } from '../../../src/shared/schemas/formulation';

const dir = join(__dirname, '../../fixtures/lp');
function fixture(name: string) {
  return JSON.parse(readFileSync(join(dir, `${name}.json`), 'utf8')) as {
    source: string;
    problem: unknown;
    expect: { kg?: Record<string, number>; percent?: Record<string, number>; costPerBatch?: number; binding?: Record<string, string | null>; decimals: number; costDecimals?: number };
  };
}

function solveOptimal(problem: unknown): OptimalResult {
  const r = solveFormula(problem);
  assert.equal(r.status, 'optimal', JSON.stringify(r));
  return r as OptimalResult;
}

function closeTo(actual: number, expected: number, decimals: number, what: string) {
  assert.ok(Math.abs(actual - expected) <= 0.5 * 10 ** -decimals + 1e-12, `${what}: ${actual} is not ${expected} to ${decimals} decimals`);
}

function checkCase(name: string) {
  const f = fixture(name);
  const r = solveOptimal(f.problem);
  const kg = new Map(r.mix.map((m) => [m.id, m]));
  for (const [id, v] of Object.entries(f.expect.kg ?? {})) closeTo(kg.get(id)?.kg ?? 0, v, f.expect.decimals, `${id} kg`);
  for (const [id, v] of Object.entries(f.expect.percent ?? {})) closeTo(kg.get(id)?.percent ?? 0, v, f.expect.decimals, `${id} %`);
  if (f.expect.costPerBatch !== undefined) closeTo(r.costPerBatch, f.expect.costPerBatch, f.expect.costDecimals ?? f.expect.decimals, 'cost');
  for (const [id, side] of Object.entries(f.expect.binding ?? {})) {
    assert.equal(r.nutrients.find((n) => n.id === id)?.binding, side, `${id} binding`);
  }
  return r;
}

describe('published worked examples', () => {
  // Source: Taha, Operations Research: An Introduction, Ozark Farms diet problem (edition from memory).
  test('Taha Ozark Farms diet problem: corn 470.59 kg, soybean meal 329.41 kg, $437.65', () => {
    checkCase('taha-ozark-farms');
  });

  // Source: solver regression case from a public worked blending problem (origin textbook unknown).
  test('three-feed blend with a Ca band: Ca binds at its 1.2 % max, protein at 22 %', () => {
    const r = checkCase('three-feed-ca-band');
    // The fibre level of the published optimum (3.88 %) is not binding.
    closeTo(r.nutrients.find((n) => n.id === 'fibre')!.value, 3.88, 2, 'fibre %');
  });

  // Source: Pearson square, swine example (agricultural-education worked example, arithmetic re-done).
  test('Pearson square, swine: 1,487.3 lb corn + 512.7 lb soybean meal per 2,000 lb at 18 % CP', () => {
    checkCase('pearson-swine-18cp');
  });

  // Source: Pearson square, corn 8.9 % / soybean meal 45.8 % to 15 % CP (study-guide explanation).
  test('Pearson square, 15 % CP: corn 83.47 %, soybean meal 16.53 %', () => {
    checkCase('pearson-praxis-15cp');
  });

  // Source: Montana State University Extension, "Pearson Square Examples".
  test('Pearson square, forage: hay 13.8 %, corn silage 86.2 % at 11 % CP', () => {
    checkCase('pearson-forage-11cp');
  });

  // Hand check of the Pearson square itself: parts are the distances to the target.
  test('Pearson square by hand: shares equal (high - target) / (high - low) for any pair', () => {
    for (const [low, high, target] of [[8.9, 44.4, 18], [10, 40, 25], [12.25, 10.8, 11]]) {
      const r = solveOptimal({
        batchKg: 1000,
        ingredients: [
          { id: 'a', pricePerKg: 1, nutrients: { cp: low } },
          { id: 'b', pricePerKg: 2, nutrients: { cp: high } },
        ],
        nutrients: [{ id: 'cp', min: target, max: target }],
      });
      const share = (high - target) / (high - low);
      closeTo(r.mix.find((m) => m.id === 'a')!.kg, 1000 * share, 6, `share of a for ${low}/${high}/${target}`);
    }
  });
});
