/**
 * From a grid of cells to samples and fields, in either layout a lab may send:
 * - one sample per row: the header names the nutrients, each line is a sample;
 * - one nutrient per row: a column names the nutrients (with optional unit and basis columns), each
 *   other column is a sample.
 * Pure functions.
 */
import { normaliseLabel, suggestField, unitFromText, basisFromText } from './words';
import { IGNORE, type LabField, type LabIssue, type LabSample, type LabTable, type Layout } from './types';

/** Spreadsheet-style column name (A, B, … AA) for a 0-based index. */
export function columnLetter(index: number): string {
  let s = '';
  let n = index + 1;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** Header names made unique and never blank: "Column D" for a blank one, "Ash (2)" for a repeat. */
function headerNames(header: string[], width: number): string[] {
  const seen = new Map<string, number>();
  return Array.from({ length: width }, (_, i) => {
    const base = (header[i] ?? '').trim() || `Column ${columnLetter(i)}`;
    const n = (seen.get(base) ?? 0) + 1;
    seen.set(base, n);
    return n === 1 ? base : `${base} (${n})`;
  });
}

const isBlank = (row: string[]) => row.every((c) => c.trim() === '');

const nutrientish = (label: string, known?: ReadonlySet<string>) => {
  const s = suggestField(label, known);
  return s.target !== IGNORE && !['sample_id', 'sample_name', 'analysed_on'].includes(s.target);
};

/**
 * Guesses the layout: nutrient words across the header mean one sample per row, nutrient words down
 * the first column mean one nutrient per row.
 */
export function detectLayout(rows: string[][], known?: ReadonlySet<string>): Layout {
  const header = rows[0] ?? [];
  const across = header.filter((h) => nutrientish(h, known)).length;
  const down = rows.slice(1).filter((r) => nutrientish(r[0] ?? '', known)).length;
  return down > across ? 'nutrient_per_row' : 'sample_per_row';
}

const LABEL_WORDS = /^(nutrient|nutrients|parameter|parameters|analyte|analytes|component|components|determination|test|tests|item|items|analysis|constituent|name)$/;
const UNIT_WORDS = /^(unit|units|uom|unit of measure)$/;
const BASIS_WORDS = /^(basis|reporting basis|reported on)$/;
const SKIP_WORDS = /^(method|methods|reference method|comment|comments|note|notes|loq|lod|limit of quantification|uncertainty|accreditation|accredited)$/;

/** Builds the samples and fields of a grid in the given layout, with problems of shape found on the way. */
export function buildTable(rows: string[][], layout: Layout): { table: LabTable; issues: LabIssue[] } {
  const width = Math.max(...rows.map((r) => r.length));
  const names = headerNames(rows[0], width);
  const issues: LabIssue[] = [];
  const headerWidth = rows[0].length;
  rows.forEach((row, i) => {
    if (i > 0 && !isBlank(row) && row.length > headerWidth && row.slice(headerWidth).some((c) => c.trim() !== '')) {
      issues.push({ severity: 'error', line: i + 1, column: null, message: `Line ${i + 1} has ${row.length} cells but the header has ${headerWidth}: a separator or quote is out of place, or the header lacks a column name.` });
    }
  });
  if (layout === 'sample_per_row') {
    const fields: LabField[] = names.map((name, c) => ({ key: name, line: 1, column: name, unitHint: unitFromText(rows[0][c] ?? ''), basisHint: basisFromText(rows[0][c] ?? '') }));
    const samples: LabSample[] = [];
    rows.forEach((row, i) => {
      if (i === 0 || isBlank(row)) return;
      const cells: LabSample['cells'] = {};
      names.forEach((name, c) => (cells[name] = { raw: row[c] ?? '', line: i + 1, column: name }));
      samples.push({ index: samples.length, line: i + 1, column: null, cells });
    });
    return { table: { layout, fields, samples }, issues };
  }
  const norm = names.map((n) => normaliseLabel(n));
  let labelCol = norm.findIndex((n) => LABEL_WORDS.test(n));
  if (labelCol < 0) labelCol = 0;
  const unitCol = norm.findIndex((n, i) => i !== labelCol && UNIT_WORDS.test(n));
  const basisCol = norm.findIndex((n, i) => i !== labelCol && BASIS_WORDS.test(n));
  const valueCols = names.map((_, i) => i).filter((i) => i !== labelCol && i !== unitCol && i !== basisCol && !SKIP_WORDS.test(norm[i]) && rows.slice(1).some((r) => (r[i] ?? '').trim() !== ''));
  const fields: LabField[] = [];
  const seen = new Map<string, number>();
  const rowKeys: (string | null)[] = rows.map((row, i) => {
    if (i === 0 || isBlank(row)) return null;
    const label = (row[labelCol] ?? '').trim();
    if (!label) {
      issues.push({ severity: 'error', line: i + 1, column: names[labelCol], message: `Line ${i + 1} has values but no nutrient name in column “${names[labelCol]}”.` });
      return null;
    }
    const n = (seen.get(label) ?? 0) + 1;
    seen.set(label, n);
    const key = n === 1 ? label : `${label} (${n})`;
    const unitText = unitCol >= 0 ? (row[unitCol] ?? '') : '';
    const basisText = basisCol >= 0 ? (row[basisCol] ?? '') : '';
    fields.push({ key, line: i + 1, column: names[labelCol], unitHint: unitFromText(unitText) ?? unitFromText(label), basisHint: basisFromText(basisText) ?? basisFromText(unitText) ?? basisFromText(label) });
    return key;
  });
  const samples: LabSample[] = valueCols.map((c, index) => {
    const cells: LabSample['cells'] = {};
    rows.forEach((row, i) => {
      const key = rowKeys[i];
      if (key) cells[key] = { raw: row[c] ?? '', line: i + 1, column: names[c] };
    });
    return { index, line: null, column: names[c], cells };
  });
  return { table: { layout, fields, samples }, issues };
}
