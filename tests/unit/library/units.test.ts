import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import {
  asFedToDryMatter,
  canConvert,
  convertUnit,
  dailyMgToPercent,
  dryMatterToAsFed,
  gPerKgToPercent,
  kcalToMJ,
  mgPerKgToPercent,
  mjToKcal,
  percentToDailyMg,
  percentToGPerKg,
  percentToMgPerKg,
  valueOnBasis,
} from '../../../src/shared/units';

const close = (actual: number, expected: number, tolerance: number, what: string) =>
  assert.ok(Math.abs(actual - expected) <= tolerance, `${what}: got ${actual}, expected ${expected} ± ${tolerance}`);

describe('as-fed and dry-matter values', () => {
  test('corn at 8.5 % CP as fed and 89 % DM has 9.55 % CP in the dry matter', () => {
    // value_DM = value_asfed × 100 / DM (standard definition of a dry-matter basis; worked example 8.5 / 0.89 = 9.55).
    close(asFedToDryMatter(8.5, 89), 9.55, 0.005, 'CP on DM');
    close(dryMatterToAsFed(9.5506, 89), 8.5, 0.001, 'back to as fed');
  });

  test('energy converts like any other value: 3,775.2 kcal/kg DM is 3,359.9 kcal/kg as fed at 89 % DM', () => {
    // NRC (1994) Appendix B, Table B-1 corn equation (Janssen 1989) applied to the same corn: 3,359.9 as fed, ÷ 0.89.
    close(dryMatterToAsFed(3775.2, 89), 3359.9, 0.1, 'AMEn as fed');
  });

  test('dry matter itself reads 100 % on a dry-matter basis and a DM outside (0, 100] is refused', () => {
    assert.equal(valueOnBasis(89, 89, 'dry_matter', 'dm'), 100);
    assert.equal(valueOnBasis(8.5, 89, 'as_fed', 'cp'), 8.5);
    assert.throws(() => asFedToDryMatter(1, 0), /dry matter/);
    assert.throws(() => dryMatterToAsFed(1, 120), /dry matter/);
  });

  test('as fed → dry matter → as fed returns the value for any DM', () => {
    for (const dm of [20, 34.1, 88, 89, 92, 97, 100]) {
      for (const value of [0, 0.02, 8.5, 49.1, 3350]) close(dryMatterToAsFed(asFedToDryMatter(value, dm), dm), value, 1e-9, `round trip at ${dm} %`);
    }
  });
});

describe('mass and energy units', () => {
  test('1 % = 10 g/kg = 10,000 mg/kg (ppm)', () => {
    assert.equal(percentToGPerKg(1), 10);
    close(gPerKgToPercent(18.5), 1.85, 1e-12, 'g/kg to %'); // 18.5 g Ca/kg DM = 1.85 % (Animals 2020, 10:682, Table 1 gives g/kg)
    assert.equal(percentToMgPerKg(1), 10_000);
    close(mgPerKgToPercent(2), 0.0002, 1e-15, 'mg/kg to %');
    close(convertUnit(0.33, '%', 'g/kg'), 3.3, 1e-12, '% to g/kg');
    close(convertUnit(250, 'mg/kg', '%'), 0.025, 1e-12, 'mg/kg to %');
  });

  test('3,200 kcal/kg is 13.39 MJ/kg, with 1 kcal = 4.184 kJ', () => {
    close(kcalToMJ(3200), 13.39, 0.005, 'kcal to MJ');
    close(convertUnit(3200, 'kcal/kg', 'MJ/kg'), 13.3888, 1e-9, 'exact');
    close(mjToKcal(1), 239.006, 0.0005, '1 MJ in kcal');
    close(convertUnit(14.87, 'MJ/kg', 'kcal/kg'), 3554.02, 0.01, '14.87 MJ/kg in kcal');
  });

  test('units that measure different things do not convert', () => {
    assert.equal(canConvert('%', 'kcal/kg'), false);
    assert.equal(canConvert('IU/kg', 'IU/kg'), true);
    assert.throws(() => convertUnit(1, '%', 'MJ/kg'), /different things/);
    assert.throws(() => convertUnit(1, 'IU/kg', 'mg/kg'), /different things/);
  });

  test('a daily allowance and % of the diet: 15 g protein a day at 100 g intake is 15 %', () => {
    // NRC (1994) suggests 15 g protein a day for a commercial layer eating 100 g (summaries of NRC 1994).
    assert.equal(dailyMgToPercent(15_000, 100), 15);
    assert.equal(percentToDailyMg(15, 100), 15_000);
    // The same hen eating 120 g needs a lower share: 12.5 %.
    assert.equal(dailyMgToPercent(15_000, 120), 12.5);
    assert.throws(() => dailyMgToPercent(1, 0), /intake/);
  });
});
