import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import {
  costPerBulkUnit,
  formatMoney,
  isCurrencyCode,
  KG_PER_LB,
  KG_PER_SHORT_TON,
  kgToLb,
  lbToKg,
  massFromKg,
  massToKg,
  pricePerKgFrom,
  pricePerMassUnit,
  shortTonToTonne,
  stepDecimals,
  tonneToShortTon,
} from '../../src/shared/measures';

const close = (a: number, b: number, rel = 1e-12) => assert.ok(Math.abs(a - b) <= rel * Math.max(1, Math.abs(b)), `${a} is not ${b}`);

// Definitions: the international yard and pound agreement of 1959 fixes 1 lb = 0.45359237 kg exactly;
// 1 short ton = 2,000 lb (US customary units, NIST Handbook 44, Appendix C); 1 t = 1,000 kg (SI).
describe('mass units', () => {
  test('the factors are the defined ones', () => {
    assert.equal(KG_PER_LB, 0.45359237);
    assert.equal(KG_PER_SHORT_TON, 907.18474);
    close(2000 * KG_PER_LB, KG_PER_SHORT_TON);
  });

  test('kg and lb convert both ways', () => {
    assert.equal(lbToKg(1), 0.45359237);
    close(kgToLb(0.45359237), 1);
    close(lbToKg(2000), 907.18474);
    close(kgToLb(1000), 2204.6226218487757); // 1000 / 0.45359237
    for (const kg of [0.01, 1, 12.5, 1000, 123456.789]) close(lbToKg(kgToLb(kg)), kg);
  });

  test('tonnes and short tons convert both ways', () => {
    close(tonneToShortTon(0.90718474), 1);
    close(shortTonToTonne(1), 0.90718474);
    close(tonneToShortTon(1), 1.1023113109243878);
    for (const t of [0.5, 1, 40, 2500]) close(shortTonToTonne(tonneToShortTon(t)), t);
  });

  test('the metric system leaves amounts and prices as they are', () => {
    assert.equal(massFromKg(12.5, 'metric'), 12.5);
    assert.equal(massToKg(12.5, 'metric'), 12.5);
    assert.equal(pricePerMassUnit(0.4, 'metric'), 0.4);
    assert.equal(costPerBulkUnit(312, 'metric'), 312);
  });

  test('US units: a price per kg becomes a price per lb, a cost per t a cost per short ton', () => {
    close(pricePerMassUnit(1, 'us'), 0.45359237);
    close(pricePerKgFrom(pricePerMassUnit(0.512, 'us'), 'us'), 0.512);
    close(costPerBulkUnit(1000, 'us'), 907.18474);
    close(massToKg(massFromKg(907.18474, 'us'), 'us'), 907.18474);
    close(massFromKg(907.18474, 'us'), 2000);
  });
});

describe('currency and steps', () => {
  test('currency codes are three capital letters', () => {
    assert.ok(isCurrencyCode('EUR'));
    assert.ok(isCurrencyCode('KES'));
    assert.ok(!isCurrencyCode('eur'));
    assert.ok(!isCurrencyCode('EURO'));
  });

  test('money shows its currency, with more digits for small prices', () => {
    assert.equal(formatMoney(312, 'EUR'), '312.00 EUR');
    assert.equal(formatMoney(0.31206, 'USD'), '0.3121 USD');
  });

  test('step decimals', () => {
    assert.equal(stepDecimals(1), 0);
    assert.equal(stepDecimals(0.5), 1);
    assert.equal(stepDecimals(0.01), 2);
    assert.equal(stepDecimals(0.05), 2);
  });
});
