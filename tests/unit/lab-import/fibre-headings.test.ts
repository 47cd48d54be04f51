import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { FIBRE_NUTRIENTS } from '../../../server/db/reference-data/fibre-fractions';
import { buildLabPreview, suggestField, type CatalogueNutrient } from '../../../src/shared/lab-import';
import { CATALOGUE, close, errors, valueOf } from './helpers';

/** The catalogue once the seed step `reference-fibre-v1` has run: NDF and ADF are nutrients. */
const WITH_FIBRE: CatalogueNutrient[] = [...CATALOGUE, ...FIBRE_NUTRIENTS.map((n) => ({ id: n.id, name: n.name, unit: n.unit }))];
const knownWithFibre = new Set(WITH_FIBRE.map((n) => n.id));
const knownWithout = new Set(CATALOGUE.map((n) => n.id));

describe('ADF and NDF headings', () => {
  const cases: [string, string, string | null, string | null][] = [
    ['ADF', 'adf', null, null],
    ['ADF %', 'adf', '%', null],
    ['ADF (% DM)', 'adf', '%', 'dry_matter'],
    ['Acid detergent fibre', 'adf', null, null],
    ['Acid Detergent Fiber, %', 'adf', '%', null],
    ['ADFom g/kg DM', 'adf', 'g/kg', 'dry_matter'],
    ['NDF', 'ndf', null, null],
    ['aNDF % DM', 'ndf', '%', 'dry_matter'],
    ['aNDFom', 'ndf', null, null],
    ['Neutral detergent fiber (as fed)', 'ndf', null, 'as_fed'],
    ['Neutral Detergent Fibre g/kg', 'ndf', 'g/kg', null],
    // Crude fibre stays crude fibre: the detergent words must not pull it over.
    ['Crude fibre', 'cf', null, null],
    ['Fibre %', 'cf', '%', null],
  ];
  for (const [header, target, unit, basis] of cases) {
    test(`“${header}” → ${target} when the catalogue keeps NDF and ADF`, () => {
      const s = suggestField(header, knownWithFibre);
      assert.deepEqual([s.target, s.unit, s.basis], [target, unit, basis]);
    });
  }

  test('a catalogue without them (before the fibre step) still reads them as auxiliary analyses for the energy equations', () => {
    assert.equal(suggestField('ADF %', knownWithout).target, 'aux:adf');
    assert.equal(suggestField('aNDF', knownWithout).target, 'aux:ndf');
    assert.equal(suggestField('Acid detergent fibre').target, 'aux:adf');
  });
});

describe('ADF and NDF through the import', () => {
  const file = 'Sample,DM %,CP %,EE %,Ash %,NDF %,ADF %,Starch %\nW,88,12,2,1.8,11,3,58\n';
  const request = { estimation: { classId: 'wheat', families: ['swine' as const] } };

  test('they are stored as measured values, per kg as fed and on dry matter', () => {
    const p = buildLabPreview(file, request, WITH_FIBRE);
    assert.equal(p.ok, true, JSON.stringify(errors(p)));
    const adf = valueOf(p, 'W', 'adf');
    const ndf = valueOf(p, 'W', 'ndf');
    assert.equal(adf?.origin, 'measured');
    assert.equal(ndf?.origin, 'measured');
    close(adf?.asFed, 3, 1e-9, 'ADF as fed');
    close(ndf?.dryMatter, (11 * 100) / 88, 1e-9, 'NDF on DM');
  });

  test('the pig energy equations find them, and give the same estimates as when they were auxiliary analyses', () => {
    const stored = buildLabPreview(file, request, WITH_FIBRE);
    const auxiliary = buildLabPreview(file, request, CATALOGUE);
    const ne = valueOf(stored, 'W', 'ne_swine');
    const de = valueOf(stored, 'W', 'de_swine');
    assert.equal(ne?.method?.id, 'noblet_ne_from_me');
    assert.equal(de?.method?.id, 'noblet_perez_de');
    for (const id of ['de_swine', 'me_swine', 'ne_swine']) close(valueOf(stored, 'W', id)?.asFed, valueOf(auxiliary, 'W', id)!.asFed, 1e-9, id);
    // NE from ME on DM: 0.726 ME + 1.33 EE + 0.39 ST − 0.62 CP − 0.83 ADF, g/kg DM (Noblet et al. 1994, as given by NRC 2012).
    const g = (pct: number) => (pct * 10) / 0.88;
    const me = valueOf(stored, 'W', 'me_swine')!;
    close(ne?.dryMatter, 0.726 * me.dryMatter + 1.33 * g(2) + 0.39 * g(58) - 0.62 * g(12) - 0.83 * g(3), 1e-6, 'NE on DM');
    // Without ADF the NE equation cannot run, and the gap says what is missing.
    const noAdf = buildLabPreview('Sample,DM %,CP %,EE %,Ash %,NDF %,Starch %\nW,88,12,2,1.8,11,58\n', request, WITH_FIBRE);
    assert.equal(valueOf(noAdf, 'W', 'ne_swine'), undefined);
    assert.match(noAdf.samples[0].gaps.find((gap) => gap.nutrientId === 'ne_swine')?.message ?? '', /ADF/);
  });

  test('values reported on dry matter are put as fed: BSF larvae, ADF 7.92 % DM at 34.1 % DM (Animals 2020, 10:682, Table 1)', () => {
    const p = buildLabPreview('Sample,DM %,ADF % DM,aNDF % DM\nL,34.1,7.92,13.0\n', {}, WITH_FIBRE);
    assert.equal(p.ok, true, JSON.stringify(errors(p)));
    close(valueOf(p, 'L', 'adf')?.asFed, (7.92 * 34.1) / 100, 1e-9, 'ADF as fed');
    close(valueOf(p, 'L', 'ndf')?.dryMatter, 13.0, 1e-9, 'aNDF on DM');
  });

  test('a lab mapping remembered before the catalogue kept them is read as the nutrients; one chosen in this import is kept as chosen', () => {
    const remembered = {
      'NDF %': { target: 'aux:ndf' as const, unit: '%' as const, basis: 'as_fed' as const },
      'ADF %': { target: 'aux:adf' as const, unit: '%' as const, basis: 'as_fed' as const },
    };
    const p = buildLabPreview(file, request, WITH_FIBRE, remembered);
    assert.deepEqual(['NDF %', 'ADF %'].map((key) => p.fields.find((f) => f.key === key)?.mapping.target), ['ndf', 'adf']);
    close(valueOf(p, 'W', 'adf')?.asFed, 3, 1e-9, 'ADF stored as fed');
    // Without the fibre step the remembered targets still work as they did.
    const old = buildLabPreview(file, request, CATALOGUE, remembered);
    assert.deepEqual(['NDF %', 'ADF %'].map((key) => old.fields.find((f) => f.key === key)?.mapping.target), ['aux:ndf', 'aux:adf']);
    // A choice made in this very import wins over the upgrade.
    const chosen = buildLabPreview(file, { ...request, mapping: { 'ADF %': remembered['ADF %'] } }, WITH_FIBRE, remembered);
    assert.equal(chosen.fields.find((f) => f.key === 'ADF %')?.mapping.target, 'aux:adf');
  });
});
