/**
 * Numbers as labs write them: decimal point or decimal comma, thousands separators, spaces.
 * Pure functions.
 */
import type { DecimalMark } from './types';

export type NumberReading = { kind: 'empty' } | { kind: 'number'; value: number } | { kind: 'formula' } | { kind: 'text'; hint: string };

const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * Reads one cell as a number.
 * - empty (or spaces) → `empty`: the lab did not report it;
 * - a number in the file's decimal mark → `number`;
 * - text starting with =, +, -, @ (or a tab) that is not a number → `formula`: it could run as a
 *   spreadsheet formula when someone opens an export, so it is refused;
 * - anything else → `text`, with a hint on what to fix.
 */
export function readNumber(raw: string, decimal: DecimalMark): NumberReading {
  const cell = raw.replace(/[\u00a0\u202f]/g, ' ').trim();
  if (cell === '') return { kind: 'empty' };
  const value = toNumber(cell, decimal);
  if (value !== null) return { kind: 'number', value };
  if (FORMULA_START.test(raw.trimStart()) && cell !== '-') return { kind: 'formula' };
  if (/^[<>≤≥]/.test(cell)) return { kind: 'text', hint: 'a value below or above a detection limit: enter the number to use, or leave the cell empty' };
  if (/^(n\.?d\.?|n\/a|na|-|—|–)$/i.test(cell)) return { kind: 'text', hint: 'leave the cell empty when the lab did not determine the value' };
  if (decimal === '.' && /^[+-]?\d+,\d+$/.test(cell)) return { kind: 'text', hint: 'it has a decimal comma while the file uses decimal points: choose "decimal comma" or correct the cell' };
  if (decimal === ',' && /^[+-]?\d+\.\d{1,2}$/.test(cell)) return { kind: 'text', hint: 'it has a decimal point while the file uses decimal commas: choose "decimal point" or correct the cell' };
  return { kind: 'text', hint: 'enter a number' };
}

function toNumber(cell: string, decimal: DecimalMark): number | null {
  let s = cell.replace(/ /g, '');
  if (decimal === ',') {
    if (/^[+-]?\d{1,3}(\.\d{3})+(,\d+)?$/.test(s)) s = s.replace(/\./g, '');
    else if (s.includes('.')) return null;
    s = s.replace(',', '.');
  } else if (/^[+-]?\d{1,3}(,\d{3})+(\.\d+)?$/.test(s)) {
    s = s.replace(/,/g, '');
  }
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(s)) return null;
  const value = Number(s);
  return Number.isFinite(value) ? value : null;
}

/** True when the cell is a number in this decimal mark. */
export function looksNumeric(raw: string, decimal: DecimalMark): boolean {
  return readNumber(raw, decimal).kind === 'number';
}

/**
 * True when a text cell would start a spreadsheet formula (=, +, -, @, tab, carriage return) and is not
 * a number. Such cells are refused rather than stored.
 */
export function isFormulaLike(raw: string): boolean {
  const cell = raw.trimStart();
  if (!FORMULA_START.test(cell) && !FORMULA_START.test(raw)) return false;
  const trimmed = cell.trim();
  if (trimmed === '' || trimmed === '-') return false;
  return toNumber(trimmed, '.') === null && toNumber(trimmed, ',') === null;
}
