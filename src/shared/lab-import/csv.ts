/**
 * Reading a lab's CSV text into a grid of cells with papaparse: separator (comma, semicolon or tab)
 * and decimal mark (point or comma) detected unless given, a UTF-8 byte-order mark removed, size limits
 * enforced. Pure: works the same in the browser and on the server.
 */
import Papa from 'papaparse';

import { looksNumeric } from './numbers';
import type { DecimalMark, Delimiter, LabIssue } from './types';

/** Largest file accepted, in bytes of UTF-8 (2 MB). */
export const MAX_FILE_BYTES = 2_000_000;
/** Most lines accepted, header included. */
export const MAX_ROWS = 5_000;

export const DELIMITER_LABELS: Record<Delimiter, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab' };

export type CsvOptions = { delimiter?: Delimiter | 'auto'; decimal?: DecimalMark | 'auto' };

/** A parsed file: `rows[i]` is line i + 1 of the file (blank lines kept as empty rows so numbers match). */
export type CsvGrid = { rows: string[][]; delimiter: Delimiter; decimal: DecimalMark; hadBom: boolean; bytes: number };

export type CsvResult = { ok: true; grid: CsvGrid; issues: LabIssue[] } | { ok: false; issues: LabIssue[]; bytes: number };

const fileError = (message: string): LabIssue => ({ severity: 'error', line: null, column: null, message });

/** UTF-8 length of a text, in bytes. */
export function utf8Bytes(text: string): number {
  let bytes = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 0x80) bytes += 1;
    else if (c < 0x800) bytes += 2;
    else if (c >= 0xd800 && c <= 0xdbff) {
      bytes += 4;
      i++;
    } else bytes += 3;
  }
  return bytes;
}

const megabytes = (bytes: number) => `${(bytes / 1_000_000).toLocaleString('en-GB', { maximumFractionDigits: 1 })} MB`;

/** The size check alone, for refusing a file before reading it (a browser knows `File.size`). */
export function checkFileSize(bytes: number): LabIssue | null {
  if (bytes > MAX_FILE_BYTES) return fileError(`The file is ${megabytes(bytes)}; the limit is ${megabytes(MAX_FILE_BYTES)}. Split it into smaller files or remove columns you do not need.`);
  return null;
}

/** Checks before parsing: size, emptiness, line count. */
function precheck(text: string): { issues: LabIssue[]; bytes: number; body: string; hadBom: boolean } {
  const bytes = utf8Bytes(text);
  const tooBig = checkFileSize(bytes);
  if (tooBig) return { issues: [tooBig], bytes, body: '', hadBom: false };
  const hadBom = text.charCodeAt(0) === 0xfeff;
  const body = hadBom ? text.slice(1) : text;
  if (body.trim() === '') return { issues: [fileError('The file is empty. Choose the CSV file the lab sent, with a header row and at least one sample.')], bytes, body, hadBom };
  if (body.includes('\u0000')) return { issues: [fileError('This is not a text file (it holds binary data). Save the lab report as CSV and choose that file.')], bytes, body, hadBom };
  let lines = 1;
  for (let i = 0; i < body.length; i++) if (body.charCodeAt(i) === 10) lines++;
  if (lines > MAX_ROWS + 1 || (lines === MAX_ROWS + 1 && !body.endsWith('\n'))) {
    return { issues: [fileError(`The file has ${lines.toLocaleString('en-GB')} lines; the limit is ${MAX_ROWS.toLocaleString('en-GB')}. Split it into smaller files.`)], bytes, body, hadBom };
  }
  return { issues: [], bytes, body, hadBom };
}

/** Separator to use: the given one, or papaparse's guess among comma, semicolon and tab. */
function pickDelimiter(body: string, requested: CsvOptions['delimiter']): Delimiter {
  if (requested && requested !== 'auto') return requested;
  const guess = Papa.parse<string[]>(body.slice(0, 20_000), { delimitersToGuess: [',', ';', '\t'], preview: 30 }).meta.delimiter;
  return guess === ';' || guess === '\t' ? guess : ',';
}

/**
 * Decimal mark: the given one, or the more common of "12,5" and "12.5" among the data cells.
 * With comma-separated columns a decimal comma can only appear in quoted cells, which still count.
 */
export function detectDecimal(rows: string[][]): DecimalMark {
  let comma = 0;
  let point = 0;
  for (const row of rows.slice(1, 400)) {
    for (const raw of row) {
      const cell = raw.trim();
      if (/^[+-]?\d{1,3}(\.\d{3})+,\d+$/.test(cell) || /^[+-]?\d+,\d+$/.test(cell)) comma++;
      else if (/^[+-]?\d{1,3}(,\d{3})+\.\d+$/.test(cell) || /^[+-]?\d*\.\d+$/.test(cell)) point++;
    }
  }
  return comma > point ? ',' : '.';
}

function finish(rows: string[][], body: string, bytes: number, hadBom: boolean, delimiter: Delimiter, options: CsvOptions): CsvResult {
  // papaparse gives a last empty row for a final newline.
  while (rows.length > 0 && rows[rows.length - 1].every((c) => c.trim() === '')) rows.pop();
  const issues: LabIssue[] = [];
  const width = Math.max(0, ...rows.map((r) => r.length));
  if (rows.length === 0) return { ok: false, bytes, issues: [fileError('The file is empty. Choose the CSV file the lab sent, with a header row and at least one sample.')] };
  if (width < 2) {
    const other = [',', ';', '\t', '|'].find((d) => d !== delimiter && body.includes(d));
    const found = other ? ` The file seems to use ${other === '|' ? 'a vertical bar (|)' : `the ${DELIMITER_LABELS[other as Delimiter]}`} instead.` : '';
    return {
      ok: false,
      bytes,
      issues: [fileError(`Found only one column with the ${DELIMITER_LABELS[delimiter]} as separator.${found} Save the file with commas, semicolons or tabs between columns, or choose the separator it uses.`)],
    };
  }
  const header = rows[0];
  const filled = header.filter((c) => c.trim() !== '');
  if (filled.length === 0) return { ok: false, bytes, issues: [{ severity: 'error', line: 1, column: null, message: 'The first line is blank: the file needs a header row naming each column (e.g. Sample; Dry matter %; Crude protein %).' }] };
  const decimal = options.decimal && options.decimal !== 'auto' ? options.decimal : detectDecimal(rows);
  const numericHeaders = filled.filter((c) => looksNumeric(c, decimal)).length;
  if (numericHeaders >= Math.max(2, Math.ceil(filled.length / 2))) {
    return { ok: false, bytes, issues: [{ severity: 'error', line: 1, column: null, message: `The first line holds numbers (${filled.slice(0, 3).join(', ')}…), not column names. Add a header row naming each column (e.g. Sample; Dry matter %; Crude protein %).` }] };
  }
  if (rows.length < 2) return { ok: false, bytes, issues: [{ severity: 'error', line: 1, column: null, message: 'The file has a header row but no samples below it.' }] };
  return { ok: true, grid: { rows, delimiter, decimal, hadBom, bytes }, issues };
}

/**
 * Parses CSV text at once (the server, and small files in the browser).
 * @param text the file's text; a leading byte-order mark is removed
 */
export function parseCsv(text: string, options: CsvOptions = {}): CsvResult {
  const pre = precheck(text);
  if (pre.issues.length) return { ok: false, issues: pre.issues, bytes: pre.bytes };
  const delimiter = pickDelimiter(pre.body, options.delimiter);
  const parsed = Papa.parse<string[]>(pre.body, { delimiter, skipEmptyLines: false });
  return finish(parsed.data, pre.body, pre.bytes, pre.hadBom, delimiter, options);
}

/**
 * The same parse in chunks, yielding between them so a page can show progress on a large file.
 * @param onProgress share of the text read so far, 0 to 1
 */
export function parseCsvInChunks(text: string, options: CsvOptions, onProgress: (share: number) => void, chunkBytes = 64_000): Promise<CsvResult> {
  const pre = precheck(text);
  if (pre.issues.length) return Promise.resolve({ ok: false, issues: pre.issues, bytes: pre.bytes });
  const delimiter = pickDelimiter(pre.body, options.delimiter);
  return new Promise((resolve) => {
    const rows: string[][] = [];
    let read = 0;
    Papa.parse<string[]>(pre.body, {
      delimiter,
      skipEmptyLines: false,
      chunkSize: chunkBytes,
      chunk: (results: Papa.ParseResult<string[]>, parser: Papa.Parser) => {
        for (const row of results.data) rows.push(row);
        read = Math.min(pre.body.length, read + chunkBytes);
        onProgress(read / pre.body.length);
        parser.pause();
        setTimeout(() => parser.resume(), 0);
      },
      complete: () => {
        onProgress(1);
        resolve(finish(rows, pre.body, pre.bytes, pre.hadBom, delimiter, options));
      },
    });
  });
}
