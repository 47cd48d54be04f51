import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { buildLabPreview, MAX_FILE_BYTES, MAX_ROWS, parseCsv, parseCsvInChunks } from '../../../src/shared/lab-import';
import { bigFile, CATALOGUE, close, errors, fixture, valueOf } from './helpers';

const BSF = { estimation: { classId: 'bsf_partially_defatted' } };

describe('good files in each layout', () => {
  test('one sample per row, commas, decimal points: every nutrient mapped from its header and converted', () => {
    const p = buildLabPreview(fixture('sample-per-row.csv'), BSF, CATALOGUE);
    assert.equal(p.ok, true, JSON.stringify(p.issues));
    assert.deepEqual([p.file.delimiter, p.file.decimal, p.file.layout], [',', '.', 'sample_per_row']);
    assert.deepEqual(p.samples.map((s) => [s.sampleId, s.name, s.analysedOn, s.dryMatterPct]), [
      ['OH-0312', 'Larvae meal, brewery grains', '2026-03-12', 92.4],
      ['OH-0319', 'Larvae meal, vegetable waste', '2026-03-19', 93.1],
    ]);
    // 21.5 g/kg = 2.15 % (1 % = 10 g/kg); on DM 2.15 × 100 / 92.4.
    close(valueOf(p, 'OH-0312', 'ca')?.asFed, 2.15, 1e-9, 'Ca as fed');
    close(valueOf(p, 'OH-0312', 'ca')?.dryMatter, 2.3268, 1e-4, 'Ca on DM');
    const cp = valueOf(p, 'OH-0312', 'cp');
    assert.equal(cp?.origin, 'measured');
    assert.equal(cp?.fieldKey, 'Crude protein (N x 6.25) %');
    // Met + Cys is the sum of the two analyses, marked as calculated.
    const metcys = valueOf(p, 'OH-0312', 'metcys');
    assert.equal(metcys?.origin, 'calculated');
    close(metcys?.asFed, 1.03, 1e-9, 'Met + Cys');
  });

  test('one nutrient per row, semicolons, decimal commas, a byte-order mark and a unit column', () => {
    const p = buildLabPreview(fixture('nutrient-per-row-semicolon.csv'), BSF, CATALOGUE);
    assert.equal(p.ok, true, JSON.stringify(p.issues));
    assert.deepEqual([p.file.delimiter, p.file.decimal, p.file.layout, p.file.hadBom], [';', ',', 'nutrient_per_row', true]);
    assert.deepEqual(p.samples.map((s) => s.sampleId), ['OH-0312', 'OH-0319']);
    close(valueOf(p, 'OH-0312', 'dm')?.asFed, 92.4, 1e-9, 'DM read with a decimal comma');
    close(valueOf(p, 'OH-0312', 'cf')?.asFed, 7.9, 1e-9, 'CF 79 g/kg is 7.9 %');
    close(valueOf(p, 'OH-0312', 'ca')?.asFed, 2.15, 1e-9, 'Ca 21.500 mg/kg (thousands point) is 2.15 %');
    // The same analysis in both layouts gives the same values.
    const across = buildLabPreview(fixture('sample-per-row.csv'), BSF, CATALOGUE);
    for (const id of ['dm', 'cp', 'ee', 'cf', 'ash', 'ca', 'p', 'lys']) close(valueOf(p, 'OH-0319', id)?.asFed, valueOf(across, 'OH-0319', id)!.asFed, 1e-9, id);
  });

  test('tab-separated with ppm', () => {
    const p = buildLabPreview(fixture('tab-separated.csv'), { estimation: { classId: 'soybean_meal' } }, CATALOGUE);
    assert.equal(p.ok, true, JSON.stringify(p.issues));
    assert.equal(p.file.delimiter, '\t');
    close(valueOf(p, 'TV-01', 'na')?.asFed, 0.12, 1e-12, '1,200 ppm = 0.12 %');
  });

  test('values on a dry-matter basis are stored as fed with the sample’s dry matter', () => {
    // BSF larvae reared on brewers’ by-product, Animals 2020, 10:682 (PMC7222827) Table 1: DM 34.1 %;
    // CP 49.1, EE 36.6, ash 5.45 % DM; Ca 18.5 g/kg DM. As fed = DM value × 34.1 / 100.
    const p = buildLabPreview(fixture('dry-matter-basis.csv'), BSF, CATALOGUE);
    assert.equal(p.ok, true, JSON.stringify(p.issues));
    assert.equal(p.fields.find((f) => f.mapping.target === 'cp')?.mapping.basis, 'dry_matter');
    close(valueOf(p, 'BG-12', 'cp')?.asFed, 16.7431, 1e-4, 'CP as fed');
    close(valueOf(p, 'BG-12', 'cp')?.dryMatter, 49.1, 1e-9, 'CP on DM');
    close(valueOf(p, 'BG-12', 'ca')?.asFed, 0.63085, 1e-5, 'Ca 18.5 g/kg DM as fed in %');
    assert.equal(valueOf(p, 'BG-12', 'cp')?.reported?.basis, 'dry_matter');
  });

  test('a file-level basis applies to headers that do not state one, and a chosen mapping overrides suggestions', () => {
    const text = 'Sample,DM %,Protein\nX-1,90,50\n';
    const p = buildLabPreview(text, { basis: 'dry_matter', estimation: { classId: 'other' } }, CATALOGUE);
    close(valueOf(p, 'X-1', 'cp')?.asFed, 45, 1e-9, 'CP 50 % DM at 90 % DM');
    const chosen = buildLabPreview(text, { mapping: { Protein: { target: 'cp', unit: 'g/kg', basis: 'as_fed' } }, estimation: { classId: 'other' } }, CATALOGUE);
    close(valueOf(chosen, 'X-1', 'cp')?.asFed, 5, 1e-9, 'CP 50 g/kg');
  });

  test('moisture gives the dry matter', () => {
    const p = buildLabPreview('Sample;Moisture %;Crude protein %\nM-1;8,5;44\n', { estimation: { classId: 'other' } }, CATALOGUE);
    assert.equal(p.ok, true, JSON.stringify(p.issues));
    close(p.samples[0].dryMatterPct!, 91.5, 1e-9, 'DM = 100 − moisture');
  });
});

describe('broken files: each with a clear message', () => {
  const only = (text: string) => {
    const p = buildLabPreview(text, BSF, CATALOGUE);
    assert.equal(p.ok, false);
    return errors(p);
  };

  test('wrong separator', () => {
    const [e] = only(fixture('wrong-delimiter.csv'));
    assert.match(e.message, /only one column/);
    assert.match(e.message, /vertical bar/);
  });

  test('text in numbers: each cell with its line and column', () => {
    const e = only(fixture('text-in-numbers.csv'));
    assert.deepEqual(e.map((i) => [i.line, i.column]), [[3, 'Crude protein %'], [4, 'Crude fat %']]);
    assert.match(e[0].message, /“n\.d\.” is not a number.*leave the cell empty/);
    assert.match(e[1].message, /detection limit/);
  });

  test('an empty file, and one with only blank lines', () => {
    assert.match(only(fixture('empty.csv'))[0].message, /The file is empty/);
    assert.match(only('\n\n  \n')[0].message, /The file is empty/);
  });

  test('a header only', () => {
    assert.match(only('Sample,DM %,CP %\n')[0].message, /no samples/);
  });

  test('a formula cell is refused wherever it is, even in a column not imported', () => {
    const e = only(fixture('formula-injection.csv'));
    assert.equal(e.length, 1);
    assert.deepEqual([e[0].line, e[0].column], [2, 'Comment']);
    assert.match(e[0].message, /spreadsheet formula/);
    for (const cell of ['+cmd|x', '-2+3+cmd', '@SUM(A1)', '=1+1']) {
      assert.match(only(`Sample,DM %,CP %\n"${cell}",90,40\n`)[0].message, /spreadsheet formula/, cell);
    }
    // Signed numbers are numbers, not formulas; a negative content is refused for what it is.
    const negative = only('Sample,DM %,CP %\nA,90,-4\n');
    assert.match(negative[0].message, /negative/);
  });

  test('a missing header row', () => {
    const [e] = only(fixture('missing-header.csv'));
    assert.equal(e.line, 1);
    assert.match(e.message, /not column names.*Add a header row/);
  });

  test('implausible values, proximate sum over 100 % of DM and a duplicate sample id', () => {
    const e = only(fixture('implausible.csv'));
    const text = e.map((i) => `${i.line}|${i.column}|${i.message}`);
    assert.ok(text.some((t) => /^2\|Crude protein %\|.*above the plausible 90 %/.test(t)), text.join('\n'));
    assert.ok(text.some((t) => /^3\|Dry matter %\|.*dry matter 102 % is impossible/.test(t)), text.join('\n'));
    assert.ok(text.some((t) => /^4\|.*add up to 111 % of dry matter/.test(t)), text.join('\n'));
    assert.ok(text.some((t) => /^5\|Sample\|.*“I-1” appears twice \(lines 2 and 5\)/.test(t)), text.join('\n'));
  });

  test('more cells than the header has', () => {
    const [e] = only('Sample,DM %,CP %\nA,90,40,12\n');
    assert.equal(e.line, 2);
    assert.match(e.message, /3 cells|4 cells/);
  });

  test('no dry matter', () => {
    const e = only('Sample,CP %\nA,40\n');
    assert.match(e[0].message, /Dry matter is not mapped/);
  });

  test('two columns mapped to one nutrient, and a unit that cannot be converted', () => {
    const twice = only('Sample,DM %,CP %,Protein\nA,90,40,41\n');
    assert.match(twice[0].message, /“CP %” and “Protein” are all mapped to Crude protein/);
    const p = buildLabPreview('Sample,DM %,CP\nA,90,40\n', { mapping: { CP: { target: 'cp', unit: 'kcal/kg', basis: 'as_fed' } } }, CATALOGUE);
    assert.match(errors(p)[0].message, /is in kcal\/kg but Crude protein is kept in %/);
  });

  test('a 5 MB file is refused before it is read, with the limit in the message', () => {
    const text = bigFile(5_000_000);
    const [e] = only(text);
    assert.match(e.message, /The file is 5 MB; the limit is 2 MB/);
  });

  test('more than 5,000 lines is refused', () => {
    const text = `Sample,DM %\n${Array.from({ length: MAX_ROWS + 1 }, (_, i) => `S${i},90`).join('\n')}\n`;
    assert.ok(text.length < MAX_FILE_BYTES);
    assert.match(only(text)[0].message, /lines; the limit is 5,000/);
  });
});

describe('parsing in chunks', () => {
  test('gives the same rows as parsing at once and reports progress up to 1', async () => {
    const text = bigFile(1_500_000);
    const shares: number[] = [];
    const chunked = await parseCsvInChunks(text, {}, (s) => shares.push(s), 100_000);
    const once = parseCsv(text);
    assert.ok(chunked.ok && once.ok);
    assert.equal(chunked.grid.rows.length, once.grid.rows.length);
    assert.deepEqual(chunked.grid.rows.at(-1), once.grid.rows.at(-1));
    assert.ok(shares.length >= 10, `progress reported ${shares.length} times`);
    assert.equal(shares.at(-1), 1);
    assert.ok(shares.every((s, i) => i === 0 || s >= shares[i - 1]));
  });
});
