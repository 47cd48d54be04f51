import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { buildLabPreview, detectDecimal, readDate, readNumber, suggestField } from '../../../src/shared/lab-import';
import { CATALOGUE, close, fixture, valueOf } from './helpers';

const known = new Set(CATALOGUE.map((n) => n.id));

describe('suggestions from header words', () => {
  const cases: [string, string, string | null, string | null][] = [
    ['Crude protein', 'cp', null, null],
    ['CP', 'cp', null, null],
    ['Protein (N x 6.25)', 'cp', null, null],
    ['CP % DM', 'cp', '%', 'dry_matter'],
    ['Ether extract (g/kg DM)', 'ee', 'g/kg', 'dry_matter'],
    ['Dry matter %', 'dm', '%', null],
    ['Moisture', 'aux:moisture', null, null],
    ['Ca g/kg', 'ca', 'g/kg', null],
    ['Na ppm', 'na', 'ppm', null],
    ['Lysine', 'lys', null, null],
    ['SID Lys', 'sid_lys', null, null],
    ['Dig. lysine', 'dig_lys', null, null],
    ['Methionine + cystine', 'metcys', null, null],
    ['Met+Cys', 'metcys', null, null],
    ['Cystine', 'aux:cys', null, null],
    ['ADF', 'aux:adf', null, null],
    ['AMEn kcal/kg', 'amen_poultry', 'kcal/kg', null],
    ['Total phosphorus (%)', 'p', '%', null],
    ['Sample ID', 'sample_id', null, null],
    ['Date analysed', 'analysed_on', null, null],
    ['Zinc mg/kg', 'ignore', 'mg/kg', null],
    ['Crude fat (as fed)', 'ee', null, 'as_fed'],
  ];
  for (const [header, target, unit, basis] of cases) {
    test(`“${header}” → ${target}`, () => {
      const s = suggestField(header, known);
      assert.deepEqual([s.target, s.unit, s.basis], [target, unit, basis]);
    });
  }

  test('a remembered mapping for the lab comes before the suggestion', () => {
    const text = 'Sample,DM %,Prot.\nA,90,400\n';
    const fresh = buildLabPreview(text, {}, CATALOGUE);
    assert.equal(fresh.fields.find((f) => f.key === 'Prot.')?.mapping.target, 'ignore');
    const remembered = buildLabPreview(text, {}, CATALOGUE, { 'Prot.': { target: 'cp', unit: 'g/kg', basis: 'as_fed' } });
    close(valueOf(remembered, 'A', 'cp')?.asFed, 40, 1e-9, 'CP from the remembered g/kg mapping');
  });
});

describe('numbers, decimals and dates', () => {
  test('decimal comma and point, thousands separators', () => {
    assert.deepEqual(readNumber('12,5', ','), { kind: 'number', value: 12.5 });
    assert.deepEqual(readNumber('1.234,5', ','), { kind: 'number', value: 1234.5 });
    assert.deepEqual(readNumber('1,234.5', '.'), { kind: 'number', value: 1234.5 });
    assert.deepEqual(readNumber(' 3 350 ', '.'), { kind: 'number', value: 3350 });
    assert.equal(readNumber('12,5', '.').kind, 'text');
    assert.equal(readNumber('', '.').kind, 'empty');
    assert.equal(readNumber('=A1', '.').kind, 'formula');
    assert.equal(detectDecimal([['h'], ['1,5', '2,25'], ['3.5']]), ',');
    assert.equal(detectDecimal([['h'], ['1.5', '2.25'], ['3,5']]), '.');
  });

  test('dates in ISO or day first', () => {
    assert.equal(readDate('2026-03-12'), '2026-03-12');
    assert.equal(readDate('12/03/2026'), '2026-03-12');
    assert.equal(readDate('12.3.2026'), '2026-03-12');
    assert.equal(readDate('31/02/2026'), null);
    assert.equal(readDate('March 12'), null);
  });
});

describe('filling the gaps', () => {
  test('maize: AMEn estimated with the Janssen (1989) equation, 3,359.9 kcal/kg as fed, named and marked', () => {
    // NRC (1994) Appendix B, Table B-1, corn grain: 36.21×8.5 + 85.44×3.8 + 37.26×73.2 = 3,359.9 kcal/kg as fed.
    const p = buildLabPreview(fixture('maize.csv'), { estimation: { classId: 'maize' } }, CATALOGUE);
    const amen = valueOf(p, 'MZ-1', 'amen_poultry');
    assert.equal(amen?.origin, 'estimated');
    assert.equal(amen?.method?.name, 'Maize grain AMEn (Janssen 1989)');
    assert.match(amen?.method?.source ?? '', /Table B-1/);
    close(amen?.asFed, 3359.9, 0.05, 'AMEn as fed');
    close(amen?.dryMatter, 3775.2, 0.05, 'AMEn on DM');
  });

  test('a measured energy is never replaced by an estimate', () => {
    const p = buildLabPreview('Sample,DM %,CP %,EE %,CF %,Ash %,AMEn kcal/kg\nMZ,89,8.5,3.8,2.2,1.3,3300\n', { estimation: { classId: 'maize' } }, CATALOGUE);
    const amen = valueOf(p, 'MZ', 'amen_poultry');
    assert.equal(amen?.origin, 'measured');
    assert.equal(amen?.asFed, 3300);
  });

  test('an insect meal gets no AMEn equation silently: the gap says why', () => {
    const p = buildLabPreview(fixture('sample-per-row.csv'), { estimation: { classId: 'bsf_defatted' } }, CATALOGUE);
    assert.equal(valueOf(p, 'OH-0312', 'amen_poultry'), undefined);
    const gap = p.samples[0].gaps.find((g) => g.nutrientId === 'amen_poultry');
    assert.match(gap?.message ?? '', /No validated equation.*chitin/);
    // Chosen knowingly, the fish-meal equation is applied with a warning beside it.
    const chosen = buildLabPreview(fixture('sample-per-row.csv'), { estimation: { classId: 'bsf_defatted', poultryEquation: 'janssen_fish_meal' } }, CATALOGUE);
    const amen = valueOf(chosen, 'OH-0312', 'amen_poultry');
    assert.equal(amen?.origin, 'estimated');
    assert.match(amen?.method?.caution ?? '', /Not validated for insect meals/);
    // 35.87×92.4 − 34.08×8.2 + 42.09×27.6 (NRC 1994 Table B-1 fish meal, inputs as fed).
    close(amen?.asFed, 35.87 * 92.4 - 34.08 * 8.2 + 42.09 * 27.6, 1e-6, 'fish-meal equation on the insect meal');
  });

  test('digestible amino acids from totals with the named coefficient', () => {
    // Defatted BSF larva meal in pigs: SID of CP 0.738 (Kim et al. 2023, abstract).
    const p = buildLabPreview(fixture('sample-per-row.csv'), { estimation: { classId: 'bsf_defatted', families: ['swine'] } }, CATALOGUE);
    const sid = valueOf(p, 'OH-0312', 'sid_lys');
    assert.equal(sid?.origin, 'estimated');
    close(sid?.asFed, 2.61 * 0.738, 1e-9, 'SID Lys');
    assert.match(sid?.method?.source ?? '', /Kim et al\. \(2023\)/);
    assert.equal(valueOf(p, 'OH-0312', 'dig_lys'), undefined, 'no poultry values when only pigs were asked for');
    // Yellow mealworm meal, broilers: mean SID coefficient of AA 0.86 (Nascimento Filho et al. 2022).
    const tm = buildLabPreview(fixture('sample-per-row.csv'), { estimation: { classId: 'mealworm' } }, CATALOGUE);
    close(valueOf(tm, 'OH-0312', 'dig_lys')?.asFed, 2.61 * 0.86, 1e-9, 'digestible Lys');
  });

  test('the user overrides an estimate, or drops it, or fills a gap', () => {
    const base = { estimation: { classId: 'maize' } };
    const over = buildLabPreview(fixture('maize.csv'), { ...base, overrides: { 'MZ-1': { amen_poultry: 3300, ne_swine: 2650 } } }, CATALOGUE);
    const amen = valueOf(over, 'MZ-1', 'amen_poultry');
    assert.equal(amen?.origin, 'override');
    assert.equal(amen?.asFed, 3300);
    close(amen?.estimatedAsFed, 3359.9, 0.05, 'the estimate it replaced');
    assert.equal(valueOf(over, 'MZ-1', 'ne_swine')?.origin, 'override');
    assert.ok(!over.samples[0].gaps.some((g) => g.nutrientId === 'ne_swine'));
    const dropped = buildLabPreview(fixture('maize.csv'), { ...base, overrides: { 'MZ-1': { amen_poultry: null } } }, CATALOGUE);
    assert.equal(valueOf(dropped, 'MZ-1', 'amen_poultry'), undefined);
  });

  test('pig energies chain DE → ME → NE when NDF, starch and ADF are given', () => {
    const p = buildLabPreview('Sample,DM %,CP %,EE %,Ash %,NDF %,ADF %,Starch %\nW,88,12,2,1.8,11,3,58\n', { estimation: { classId: 'wheat', families: ['swine'] } }, CATALOGUE);
    assert.equal(p.ok, true, JSON.stringify(p.issues));
    const de = valueOf(p, 'W', 'de_swine');
    const me = valueOf(p, 'W', 'me_swine');
    const ne = valueOf(p, 'W', 'ne_swine');
    assert.deepEqual([de?.method?.id, me?.method?.id, ne?.method?.id], ['noblet_perez_de', 'nrc1998_me_from_de', 'noblet_ne_from_me']);
    assert.equal(de?.method?.confidence, 'from_memory');
    // NE from ME on DM: 0.726 ME + 1.33 EE + 0.39 ST − 0.62 CP − 0.83 ADF with g/kg DM (NRC 2012 / Noblet et al. 1994).
    const g = (pct: number) => (pct * 10) / 0.88;
    close(ne?.dryMatter, 0.726 * me!.dryMatter + 1.33 * g(2) + 0.39 * g(58) - 0.62 * g(12) - 0.83 * g(3), 1e-6, 'NE on DM');
  });
});
