import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { additionGroup, buildBatchSheet, type SheetIngredient } from '../../src/shared/batch-sheet';

// An invented broiler starter mix (demo scenario, not a recommendation): shares in % of the batch.
const MIX: SheetIngredient[] = [
  { id: 'maize', name: 'Maize', category: 'cereal_grain', percent: 55.437 },
  { id: 'soy', name: 'Soybean meal 48', category: 'oilseed_meal', percent: 33.218 },
  { id: 'bsf', name: 'Larvae meal', category: 'insect_meal', percent: 5 },
  { id: 'oil', name: 'Soybean oil', category: 'fat_and_oil', percent: 2.871 },
  { id: 'lime', name: 'Limestone', category: 'mineral', percent: 1.374 },
  { id: 'dcp', name: 'Dicalcium phosphate', category: 'mineral', percent: 1.35 },
  { id: 'salt', name: 'Salt', category: 'mineral', percent: 0.35 },
  { id: 'lys', name: 'L-Lysine HCl', category: 'synthetic_amino_acid', percent: 0.1 },
  { id: 'premix', name: 'Vitamin and trace-mineral premix', category: 'premix', percent: 0.3 },
];

const sum = (xs: number[]) => xs.reduce((s, x) => s + x, 0);

describe('batch sheet', () => {
  test('amounts add up to the batch size within the rounding step, for many batch sizes and steps', () => {
    for (const batchSize of [100, 250, 333, 500, 1000, 1234.5, 2000, 4409.25]) {
      for (const [macroStep, minorStep] of [[0.5, 0.01], [1, 0.1], [5, 0.05], [0.1, 0.001]] as const) {
        const sheet = buildBatchSheet(MIX, { batchSize, macroStep, minorStep });
        const total = sum(sheet.lines.map((l) => l.amount));
        assert.ok(Math.abs(total - batchSize) <= macroStep / 2 + 1e-9, `batch ${batchSize}, step ${macroStep}: total ${total}`);
        assert.ok(Math.abs(sheet.difference - (total - batchSize)) < 1e-6);
        for (const l of sheet.lines) {
          const units = l.amount / l.step;
          assert.ok(Math.abs(units - Math.round(units)) < 1e-6, `${l.name} ${l.amount} is not a multiple of ${l.step}`);
          // Largest remainder: each main-scale amount is within one step of its exact share.
          assert.ok(Math.abs(l.amount - l.exact) < l.step + 1e-9, `${l.name}: ${l.amount} vs ${l.exact}`);
        }
      }
    }
  });

  test('a batch that is a multiple of the step adds up exactly when every line is on the main scale', () => {
    const sheet = buildBatchSheet(MIX.slice(0, 4), { batchSize: 1000, macroStep: 0.5, minorStep: 0.01 });
    assert.equal(sheet.total, 1000);
    assert.equal(sheet.difference, 0);
  });

  test('order of addition: major ingredients, then minor and premix, then liquids', () => {
    const sheet = buildBatchSheet(MIX, { batchSize: 1000 });
    assert.deepEqual(sheet.lines.map((l) => l.id), ['maize', 'soy', 'bsf', 'lime', 'dcp', 'salt', 'premix', 'lys', 'oil']);
    assert.deepEqual(sheet.lines.map((l) => l.order), [1, 2, 3, 4, 5, 6, 7, 8, 9]);
    assert.deepEqual([...new Set(sheet.lines.map((l) => l.group))], ['macro', 'minor', 'liquid']);
  });

  test('premix and micro-ingredients are called out and weighed on the small scale', () => {
    const sheet = buildBatchSheet(MIX, { batchSize: 1000, macroStep: 0.5, minorStep: 0.01 });
    const premix = sheet.lines.find((l) => l.id === 'premix')!;
    assert.equal(premix.group, 'minor');
    assert.equal(premix.step, 0.01);
    assert.equal(premix.amount, 3);
    assert.match(premix.callOut!, /Premix/);
    assert.match(sheet.lines.find((l) => l.id === 'lys')!.callOut!, /Micro-ingredient/);
    assert.equal(sheet.lines.find((l) => l.id === 'maize')!.callOut, null);
  });

  test('grouping: minerals above the threshold and small amounts', () => {
    assert.equal(additionGroup({ id: 'x', name: 'Limestone', category: 'mineral', percent: 8 }, 1000), 'macro');
    assert.equal(additionGroup({ id: 'x', name: 'Limestone', category: 'mineral', percent: 8 }, 1000, { minorMaxPercent: 10 }), 'minor');
    // 0.5 % of a 100 kg batch is 0.5 kg, one main-scale step: it goes on the small scale.
    assert.equal(additionGroup({ id: 'x', name: 'Fish meal', category: 'animal_protein', percent: 0.5 }, 100), 'minor');
    assert.equal(additionGroup({ id: 'x', name: 'Fish meal', category: 'animal_protein', percent: 0.5 }, 10000), 'macro');
  });

  test('shares that do not add up to exactly 100 % are scaled; zero shares are left out', () => {
    const sheet = buildBatchSheet([...MIX.map((m) => ({ ...m, percent: m.percent * 1.0000001 })), { id: 'none', name: 'Unused', category: 'cereal_grain', percent: 0 }], { batchSize: 500 });
    assert.ok(!sheet.lines.some((l) => l.id === 'none'));
    assert.ok(Math.abs(sheet.total - 500) <= 0.25);
  });

  test('refuses a batch of 0', () => {
    assert.throws(() => buildBatchSheet(MIX, { batchSize: 0 }), /batchSize/);
  });
});
