import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import {
  SUBSTRATE_KINDS,
  SUBSTRATES,
  defatSplit,
  planSupply,
  type SupplyPlanResult,
  type SupplyStreamInput,
} from '../../../src/shared/supply';

const close = (actual: number, expected: number, tol: number, what: string) =>
  assert.ok(Math.abs(actual - expected) <= tol, `${what}: expected ${expected} ± ${tol}, got ${actual}`);
const within = (actual: number, target: number, relative: number, what: string) =>
  assert.ok(Math.abs(actual - target) <= relative * target, `${what}: expected about ${target} (± ${relative * 100} %), got ${actual.toFixed(3)}`);
const line = (r: SupplyPlanResult, id: string, which: 'mealComposition' | 'fullFatComposition' = 'mealComposition') => r[which].find((l) => l.id === id)!;

/** Figures as the screen shows them: 0.1 kg. */
const shown = (x: number) => Math.round(x * 10) / 10;

function assertBalanced(r: SupplyPlanResult) {
  const t = r.totals;
  // Water in the substrate = water in the larvae + water in the residue + water lost during rearing.
  close(t.substrateWaterKg, t.larvaeWaterKg + t.residueWaterKg + t.waterLostKg, 1e-6, 'water');
  // Dry matter fed = larvae + residue + respired.
  close(t.substrateDryMatterKg, t.larvaeDryMatterKg + t.residueDryMatterKg + t.respiredDryMatterKg, 1e-6, 'dry matter');
  // Protein fed = protein in the larvae + protein left in the residue or lost.
  close(t.substrateProteinKg, t.larvaeProteinKg + t.proteinNotInLarvaeKg, 1e-6, 'protein');
  // Fresh substrate = water + dry matter; fresh larvae = water + dry matter.
  close(t.substrateFreshKg, t.substrateWaterKg + t.substrateDryMatterKg, 1e-6, 'substrate');
  close(t.larvaeFreshKg, t.larvaeWaterKg + t.larvaeDryMatterKg, 1e-6, 'larvae');
  // Drying removes water only; pressing removes fat only.
  const p = r.processing;
  close(t.larvaeFreshKg, p.driedLarvaeKg + p.dryingWaterKg, 1e-6, 'drying');
  close(t.larvaeDryMatterKg, (p.mealKg * p.mealDryMatterPct) / 100 + p.oilKg, 1e-6, 'meal and oil dry matter');
  close(p.mealProteinKg, (p.mealKg * line(r, 'cp').asFedPct) / 100, 1e-6, 'protein in the meal');
  close(p.mealProteinKg, t.larvaeProteinKg, 1e-9, 'protein kept through processing');
  // The stream figures add up to the totals.
  close(r.streams.reduce((s, b) => s + b.larvae.freshKg, 0), t.larvaeFreshKg, 1e-6, 'streams add up');
  // What the screen shows (0.1 kg) still adds up within the rounding of the terms.
  const terms = [t.larvaeWaterKg, t.residueWaterKg, t.waterLostKg];
  assert.ok(Math.abs(shown(t.substrateWaterKg) - terms.reduce((s, x) => s + shown(x), 0)) <= 0.05 * (terms.length + 1) + 1e-9, 'shown water adds up within rounding');
  const dmTerms = [t.larvaeDryMatterKg, t.residueDryMatterKg, t.respiredDryMatterKg];
  assert.ok(Math.abs(shown(t.substrateDryMatterKg) - dmTerms.reduce((s, x) => s + shown(x), 0)) <= 0.05 * (dmTerms.length + 1) + 1e-9, 'shown dry matter adds up within rounding');
  for (const loss of [t.waterLostKg, t.respiredDryMatterKg, t.proteinNotInLarvaeKg]) assert.ok(loss >= -1e-9, 'no negative loss with default factors');
}

describe('mass balance of a supply plan', () => {
  test('every substrate alone balances water, dry matter and protein with its default factors', () => {
    for (const kind of SUBSTRATE_KINDS) {
      const r = planSupply([{ name: kind, substrate: kind, tonnesPerWeek: 3.7 }]);
      assertBalanced(r);
      assert.deepEqual(r.warnings, [], `${kind} gives no warning with its defaults`);
    }
  });

  test('a mix of streams, defatted, with edited factors, still balances', () => {
    const streams: SupplyStreamInput[] = [
      { name: 'Brewery grains', substrate: 'brewery_grains', tonnesPerWeek: 6, moisturePct: 76 },
      { name: 'Vegetables', substrate: 'fruit_vegetable_waste', tonnesPerWeek: 4, yields: { bioconversionDmPct: 10, larvaeDryMatterPct: 30 } },
      { name: 'Fish offal', substrate: 'fish_offal', tonnesPerWeek: 0.8, substrateCpDmPct: 55 },
    ];
    for (const defatted of [false, true]) assertBalanced(planSupply(streams, { defatted, residueMoisturePct: 35 }));
  });

  test('factors that would make dry matter or protein out of nothing are called out', () => {
    const r = planSupply([{ name: 'Odd stream', substrate: 'food_waste', tonnesPerWeek: 1, yields: { bioconversionDmPct: 60, residueDmPct: 50 } }]);
    assert.ok(r.warnings.some((w) => /Odd stream: larvae and residue together hold more dry matter/.test(w)), r.warnings.join(' | '));
    assert.ok(r.warnings.some((w) => /more protein than the substrate gives/.test(w)), r.warnings.join(' | '));
  });

  test('no streams give an empty plan, not a division by zero', () => {
    const r = planSupply([]);
    assert.equal(r.processing.mealKg, 0);
    assert.ok(r.mealComposition.every((l) => Number.isFinite(l.asFedPct)));
  });
});

// Rules of thumb of the trade (common practice, no single source): from 100 kg of food waste at about 80 % water,
// about 20 kg of fresh larvae and about 5 kg of dry residue; dried larvae roughly 42 % fat, 34–45 % crude protein,
// about 5 % calcium and 1.5 % phosphorus. "About" is taken as ± 25 %. Checks where the defaults from published
// trials land away from the rule of thumb are kept as todo with the measured figure, not bent to pass.
describe('food waste with default factors against the rules of thumb (common practice)', () => {
  const r = planSupply([{ name: 'Food waste', substrate: 'food_waste', tonnesPerWeek: 0.1 }]);

  test('food waste is about 80 % water (common practice)', () => {
    close(r.totals.substrateWaterKg, 80, 1e-9, 'water in 100 kg of food waste');
    close(r.totals.substrateDryMatterKg, 20, 1e-9, 'dry matter in 100 kg of food waste');
  });

  test('about 5 kg of dry residue from 100 kg (common practice)', () => within(r.totals.residueDryMatterKg, 5, 0.25, 'dry residue'));

  test('dried larvae roughly 42 % fat (common practice)', () => within(line(r, 'ee').asFedPct, 42, 0.25, 'fat, % as fed'));

  test('dried larvae 34 to 45 % crude protein (common practice)', () => {
    const cp = line(r, 'cp').asFedPct;
    assert.ok(cp >= 34 && cp <= 45, `crude protein ${cp.toFixed(2)} % as fed`);
  });

  test('about 20 kg of fresh larvae from 100 kg (common practice)', () => within(r.totals.larvaeFreshKg, 20, 0.25, 'fresh larvae'));

  // About 5 % calcium and 1.5 % phosphorus (common practice) describe larvae on mineral-rich substrates. Larvae on
  // food waste are low in ash (27 g/kg DM on restaurant waste, Spranghers et al. 2017), so the plan must not pass its
  // lower estimate off as the rule of thumb: it stays below it and is marked as an estimate to be confirmed by analysis.
  test('calcium and phosphorus on food waste sit below the rule of thumb (about 5 % and 1.5 %, common practice) and are marked as estimates', () => {
    for (const [id, rule] of [['ca', 5], ['p', 1.5]] as const) {
      const l = line(r, id);
      assert.ok(l.asFedPct < rule * 0.75, `${id} ${l.asFedPct.toFixed(2)} % as fed`);
      assert.equal(l.origin, 'estimate');
      assert.ok(l.sources.every((s) => s.confidence !== 'verified'), `${id} is not presented as verified`);
    }
    assert.match(SUBSTRATES.food_waste.note ?? '', /analyse the meal/);
  });
});

describe('composition by substrate', () => {
  test('a meal reared on brewery grains alone carries the published larvae composition (Animals 2020, 10:682, Table 1)', () => {
    const r = planSupply([{ name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 5 }]);
    // Table 1, % DM: CP 49.1 (N × 4.73), EE 36.6, ash 5.45, Ca 18.5 g/kg, P 4.40 g/kg.
    close(line(r, 'cp').dmPct, 49.1, 1e-9, 'CP % DM');
    close(line(r, 'ee').dmPct, 36.6, 1e-9, 'EE % DM');
    close(line(r, 'ash').dmPct, 5.45, 1e-9, 'ash % DM');
    close(line(r, 'ca').dmPct, 1.85, 1e-9, 'Ca % DM');
    close(line(r, 'p').dmPct, 0.44, 1e-9, 'P % DM');
    // As fed at 92 % DM: 49.1 × 0.92 = 45.172 (arithmetic).
    close(line(r, 'cp').asFedPct, 45.172, 1e-9, 'CP as fed');
    // Fresh larvae at 34.1 % DM (same table): larval DM ÷ 0.341.
    close(r.totals.larvaeFreshKg, r.totals.larvaeDryMatterKg / 0.341, 1e-9, 'fresh larvae');
    assert.ok(line(r, 'cp').sources[0].text.includes('Animals 2020'));
  });

  test('a mix is weighted by the larval dry matter each stream gives (hand check)', () => {
    // Grains: 6 t × 22 % DM × 15 % = 198 kg larval DM at 36.6 % fat; vegetables: 4 t × 12 % DM × 12 % = 57.6 kg at 37.1 % fat.
    const r = planSupply([
      { name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 6 },
      { name: 'Vegetables', substrate: 'fruit_vegetable_waste', tonnesPerWeek: 4 },
    ]);
    close(r.totals.larvaeDryMatterKg, 255.6, 1e-9, 'larval DM');
    close(line(r, 'ee').dmPct, (198 * 36.6 + 57.6 * 37.1) / 255.6, 1e-9, 'fat % DM');
    close(line(r, 'ash').dmPct, (198 * 5.45 + 57.6 * 9.6) / 255.6, 1e-9, 'ash % DM');
  });

  test('a lab analysis replaces the estimate for the values it gives, and only those', () => {
    const lab = { source: 'Lab report 12', dryMatterPct: 93.1, values: { cp: 42.6, ee: 31.8 } };
    const r = planSupply([{ name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 5 }], { labAnalysis: lab });
    assert.equal(line(r, 'cp').origin, 'lab');
    close(line(r, 'cp').dmPct, (42.6 * 100) / 93.1, 1e-9, 'CP from the lab on DM');
    assert.equal(line(r, 'ash').origin, 'estimate');
    close(line(r, 'ash').dmPct, 5.45, 1e-9, 'ash still estimated');
    // Protein in the meal follows the measured value.
    close(r.processing.mealProteinKg, (r.totals.larvaeDryMatterKg * 42.6) / 93.1, 1e-9, 'protein from the lab value');
    assertBalanced(r);
  });

  test('every default names its source, and values from memory say so', () => {
    for (const kind of SUBSTRATE_KINDS) {
      const d = SUBSTRATES[kind];
      for (const s of [d.moisturePct, d.substrateCpDmPct, ...Object.values(d.yields), ...Object.values(d.larvae)]) {
        assert.ok(s.source.length > 10, `${kind}: a source is named`);
        if (s.confidence === 'from_memory') assert.match(s.source, /from memory|common practice/);
      }
      const l = d.larvae;
      assert.ok(l.cp.value + l.ee.value + l.ash.value <= 100, `${kind}: protein, fat and ash fit in the dry matter`);
      assert.ok(l.ca.value + l.p.value <= l.ash.value, `${kind}: Ca and P fit in the ash`);
    }
  });
});

describe('defatting: meal and oil', () => {
  test('worked example: 1,000 kg larval DM at 36.6 % fat pressed to 14.4 % fat at 92 % DM (arithmetic)', () => {
    // Meal M: 0.92 M = 634 + 0.144 M → M = 634 / 0.776 = 817.010 kg; oil = 366 − 0.144 × 817.010 = 248.351 kg.
    const s = defatSplit(1000, 36.6, 92, 14.4);
    assert.equal(s.pressed, true);
    close(s.mealKg, 817.0103, 1e-3, 'pressed meal');
    close(s.oilKg, 248.3505, 1e-3, 'oil');
  });

  test('the pressed meal keeps the protein, holds the set fat and is richer in protein', () => {
    const streams: SupplyStreamInput[] = [{ name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 6 }];
    const full = planSupply(streams);
    const pressed = planSupply(streams, { defatted: true, residualFatPct: 10 });
    assert.equal(pressed.processing.defatted, true);
    close(line(pressed, 'ee').asFedPct, 10, 1e-9, 'fat left in the meal');
    assert.ok(line(pressed, 'cp').asFedPct > line(full, 'cp').asFedPct);
    close(pressed.processing.mealProteinKg, full.processing.mealProteinKg, 1e-9, 'protein kept');
    close(pressed.processing.mealKg + pressed.processing.oilKg, full.processing.mealKg - (full.processing.mealKg * (100 - 92)) / 100 + (pressed.processing.mealKg * (100 - 92)) / 100, 1e-6, 'only fat leaves');
    assertBalanced(pressed);
  });

  test('a lean larva gives no oil and the plan says so', () => {
    const r = planSupply([{ name: 'Grains', substrate: 'brewery_grains', tonnesPerWeek: 1 }], { defatted: true, residualFatPct: 40 });
    assert.equal(r.processing.oilKg, 0);
    assert.equal(r.processing.defatted, false);
    assert.ok(r.warnings.some((w) => /pressing would give no oil/.test(w)));
  });
});
