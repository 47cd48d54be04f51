/**
 * The whole reading of a lab file, from text to values ready to store: parse, layout, mapping
 * (suggested, remembered or chosen), unit and basis conversion, validation with the line and column of
 * each problem, gap filling and the user's overrides. The server runs it for the preview and again,
 * from the same text, before saving; the browser can run it for a quick look. Pure.
 */
import type { NutrientUnit } from '../library-terms';
import { canConvert, convertUnit, dryMatterToAsFed } from '../units';
import { parseCsv, type CsvGrid, type CsvOptions } from './csv';
import { estimateGaps, onDryMatter, type EstimationSettings, type Gap } from './estimate';
import { isFormulaLike, readNumber } from './numbers';
import { buildTable, detectLayout } from './table';
import {
  AUX_TARGETS,
  IGNORE,
  SAMPLE_TARGETS,
  type CatalogueNutrient,
  type ColumnMapping,
  type FieldMapping,
  type LabField,
  type LabIssue,
  type LabSample,
  type LabValue,
  type Layout,
  type ReportBasis,
  type SourceUnit,
} from './types';
import { nutrientOfAux, suggestField, type Suggestion } from './words';

export type PreviewRequest = CsvOptions & {
  layout?: Layout | 'auto';
  /** The basis of fields whose header does not say (a lab usually reports the whole file on one basis). */
  basis?: ReportBasis;
  /** Chosen mappings by field key; fields left out get the remembered mapping, then the suggestion. */
  mapping?: ColumnMapping;
  estimation?: EstimationSettings;
  /** Sample id → nutrient id → value per kg as fed in the catalogue unit (a number replaces an estimate, null drops it). */
  overrides?: Record<string, Record<string, number | null>>;
};

export type PreviewField = LabField & { suggestion: Suggestion; mapping: FieldMapping; examples: string[] };

export type PreviewSample = {
  sampleId: string;
  name: string | null;
  analysedOn: string | null;
  line: number | null;
  column: string | null;
  dryMatterPct: number | null;
  values: LabValue[];
  gaps: Gap[];
};

export type LabPreview = {
  /** False when any issue is an error: nothing may be saved. */
  ok: boolean;
  file: { bytes: number; lines: number; delimiter: CsvGrid['delimiter'] | null; decimal: CsvGrid['decimal'] | null; hadBom: boolean; layout: Layout | null };
  fields: PreviewField[];
  samples: PreviewSample[];
  issues: LabIssue[];
};

/**
 * Highest plausible value per kg of dry matter, in the catalogue unit (% for fractions). Bounds marked
 * "stoichiometry" are the element's share of its purest feed source; the others are common practice.
 */
export const PLAUSIBLE_MAX_ON_DM: Record<string, { max: number; why: string }> = {
  cp: { max: 90, why: 'common practice: no feed ingredient is above 90 % crude protein in its dry matter' },
  ee: { max: 100, why: 'fat cannot exceed the dry matter' },
  cf: { max: 60, why: 'common practice: even hulls and straws stay below 60 % crude fibre' },
  ash: { max: 100, why: 'ash cannot exceed the dry matter' },
  starch: { max: 90, why: 'common practice: purified starches stay below 90 % of DM' },
  chitin: { max: 40, why: 'common practice: insect meals hold about 5–10 % chitin' },
  ca: { max: 41, why: 'stoichiometry: pure calcium carbonate is 40.04 % Ca' },
  p: { max: 25, why: 'stoichiometry: pure monocalcium phosphate is 24.58 % P' },
  avp: { max: 25, why: 'stoichiometry: pure monocalcium phosphate is 24.58 % P' },
  sttd_p: { max: 25, why: 'stoichiometry: pure monocalcium phosphate is 24.58 % P' },
  na: { max: 40, why: 'stoichiometry: pure salt is 39.34 % Na' },
  cl: { max: 61, why: 'stoichiometry: pure salt is 60.66 % Cl' },
  k: { max: 53, why: 'stoichiometry: pure potassium chloride is 52.4 % K' },
};
const ENERGY_MAX_KCAL_DM = 9500; // common practice: fats, the richest feeds, have about 9,400 kcal GE per kg.

const PROXIMATE = ['cp', 'ee', 'cf', 'ash', 'starch'];
const NAMES_FALLBACK: Record<string, string> = { 'aux:moisture': 'Moisture', 'aux:adf': 'ADF', 'aux:ndf': 'NDF', 'aux:cys': 'Cystine', 'aux:nfe': 'Nitrogen-free extract', sample_id: 'Sample id', sample_name: 'Sample name', analysed_on: 'Date analysed', ignore: 'Not imported' };

/** A person's name for a target. */
export function targetName(target: string, catalogue: readonly CatalogueNutrient[]): string {
  return catalogue.find((n) => n.id === target)?.name ?? NAMES_FALLBACK[target] ?? target;
}

const fmt = (n: number) => (Math.abs(n) >= 100 ? n.toFixed(0) : Math.abs(n) >= 1 ? n.toFixed(2) : n.toPrecision(3)).replace(/\.?0+$/, '');

/** Reads a date as ISO yyyy-mm-dd; day-first for d/m/yyyy and d.m.yyyy. */
export function readDate(raw: string): string | null {
  const s = raw.trim();
  let y: number, m: number, d: number;
  let match = /^(\d{4})-(\d{1,2})-(\d{1,2})$/.exec(s);
  if (match) [y, m, d] = [Number(match[1]), Number(match[2]), Number(match[3])];
  else if ((match = /^(\d{1,2})[./](\d{1,2})[./](\d{4})$/.exec(s))) [d, m, y] = [Number(match[1]), Number(match[2]), Number(match[3])];
  else return null;
  const date = new Date(Date.UTC(y, m - 1, d));
  if (date.getUTCFullYear() !== y || date.getUTCMonth() !== m - 1 || date.getUTCDate() !== d) return null;
  return date.toISOString().slice(0, 10);
}

/**
 * A lab's mapping saved before the catalogue kept NDF and ADF sent them to the estimate-only inputs; read it as
 * the nutrient now, so the values are stored as well as used (the energy equations read either).
 */
function upToDate(mapping: FieldMapping | undefined, known: ReadonlySet<string>): FieldMapping | undefined {
  const nutrient = mapping ? nutrientOfAux(mapping.target) : null;
  return mapping && nutrient && known.has(nutrient) ? { ...mapping, target: nutrient } : mapping;
}

function resolveMappings(fields: LabField[], request: PreviewRequest, remembered: ColumnMapping | undefined, catalogue: readonly CatalogueNutrient[], samples: LabSample[]): PreviewField[] {
  const known = new Set(catalogue.map((n) => n.id));
  return fields.map((field) => {
    const suggestion = suggestField(field.key, known);
    const chosen = request.mapping?.[field.key] ?? upToDate(remembered?.[field.key], known);
    const target = chosen?.target ?? suggestion.target;
    const unitOfTarget = catalogue.find((n) => n.id === target)?.unit as SourceUnit | undefined;
    const mapping: FieldMapping = chosen
      ? { target, unit: chosen.unit, basis: chosen.basis }
      : { target, unit: field.unitHint ?? suggestion.unit ?? unitOfTarget ?? '%', basis: field.basisHint ?? suggestion.basis ?? request.basis ?? 'as_fed' };
    const examples = samples.slice(0, 3).map((s) => s.cells[field.key]?.raw ?? '');
    return { ...field, suggestion, mapping, examples };
  });
}

function checkMappings(fields: PreviewField[], catalogue: readonly CatalogueNutrient[]): LabIssue[] {
  const issues: LabIssue[] = [];
  const byTarget = new Map<string, PreviewField[]>();
  for (const f of fields) {
    const t = f.mapping.target;
    if (t === IGNORE) continue;
    byTarget.set(t, [...(byTarget.get(t) ?? []), f]);
    const nutrient = catalogue.find((n) => n.id === t);
    const isAux = (AUX_TARGETS as readonly string[]).includes(t);
    const isSample = (SAMPLE_TARGETS as readonly string[]).includes(t);
    if (!nutrient && !isAux && !isSample) {
      issues.push({ severity: 'error', line: f.line, column: f.column, message: `“${f.key}” is mapped to “${t}”, which is not a nutrient Troughline keeps: choose another nutrient or “Not imported”.` });
      continue;
    }
    const to: NutrientUnit = nutrient ? nutrient.unit : '%';
    const from: NutrientUnit = f.mapping.unit === 'ppm' ? 'mg/kg' : f.mapping.unit;
    if (!isSample && !canConvert(from, to)) {
      issues.push({ severity: 'error', line: f.line, column: f.column, message: `“${f.key}” is in ${f.mapping.unit} but ${targetName(t, catalogue)} is kept in ${to}: choose the right nutrient or unit.` });
    }
  }
  for (const [target, list] of byTarget) {
    if (list.length > 1) {
      issues.push({ severity: 'error', line: list[1].line, column: list[1].column, message: `${list.map((f) => `“${f.key}”`).join(' and ')} are all mapped to ${targetName(target, catalogue)}: map one of them to something else or to “Not imported”.` });
    }
  }
  const measured = fields.filter((f) => catalogue.some((n) => n.id === f.mapping.target) || f.mapping.target.startsWith('aux:'));
  if (measured.length === 0) issues.push({ severity: 'error', line: null, column: null, message: 'No column is mapped to a nutrient yet: choose, for each column, the nutrient it holds.' });
  if (!fields.some((f) => f.mapping.target === 'dm' || f.mapping.target === 'aux:moisture')) {
    issues.push({ severity: 'error', line: null, column: null, message: 'Dry matter is not mapped: every analysis needs the sample’s dry matter (or moisture) to be stored as fed. Map that column.' });
  }
  return issues;
}

function readSample(sample: LabSample, fields: PreviewField[], grid: CsvGrid, catalogue: readonly CatalogueNutrient[], layout: Layout, issues: LabIssue[]): PreviewSample & { known: Record<string, number> } {
  const at = (key: string) => sample.cells[key];
  const fieldFor = (target: string) => fields.find((f) => f.mapping.target === target);
  const idField = fieldFor('sample_id');
  const rawId = idField ? (at(idField.key)?.raw ?? '').trim() : '';
  const sampleId = rawId || (layout === 'nutrient_per_row' ? (sample.column ?? `Sample ${sample.index + 1}`) : `Line ${sample.line}`);
  if (idField && !rawId) issues.push({ severity: 'error', line: at(idField.key)?.line ?? sample.line, column: idField.mapping.target === 'sample_id' ? (at(idField.key)?.column ?? null) : null, message: `The sample on ${placeWords(sample)} has no id in “${idField.key}”: give every sample an id (e.g. the lab’s sample number).` });
  const nameField = fieldFor('sample_name');
  const name = nameField ? (at(nameField.key)?.raw ?? '').trim() || null : null;
  const dateField = fieldFor('analysed_on');
  let analysedOn: string | null = null;
  if (dateField) {
    const cell = at(dateField.key);
    if (cell && cell.raw.trim() !== '') {
      analysedOn = readDate(cell.raw);
      if (!analysedOn) issues.push({ severity: 'error', line: cell.line, column: cell.column, message: `Line ${cell.line}, column “${cell.column}”: “${cell.raw.trim()}” is not a date. Write it as 2026-03-12 or 12/03/2026 (day first).` });
    }
  }
  // Every cell of the sample, mapped or not, is checked for spreadsheet formulas.
  for (const cell of Object.values(sample.cells)) {
    if (isFormulaLike(cell.raw)) {
      issues.push({ severity: 'error', line: cell.line, column: cell.column, message: `Line ${cell.line}, column “${cell.column}”: “${cell.raw.trim().slice(0, 40)}” starts like a spreadsheet formula and was refused. Type the value itself (a number, or text not starting with =, +, - or @).` });
    }
  }
  // Numbers, by target, in the catalogue unit, still on the reported basis.
  const reported: { target: string; field: PreviewField; value: number; converted: number }[] = [];
  for (const field of fields) {
    const t = field.mapping.target;
    if (t === IGNORE || (SAMPLE_TARGETS as readonly string[]).includes(t)) continue;
    const cell = at(field.key);
    if (!cell) continue;
    const reading = readNumber(cell.raw, grid.decimal);
    if (reading.kind === 'empty' || reading.kind === 'formula') continue;
    if (reading.kind === 'text') {
      issues.push({ severity: 'error', line: cell.line, column: cell.column, message: `Line ${cell.line}, column “${cell.column}”: “${cell.raw.trim().slice(0, 40)}” is not a number (${reading.hint}).` });
      continue;
    }
    if (reading.value < 0) {
      issues.push({ severity: 'error', line: cell.line, column: cell.column, message: `Line ${cell.line}, column “${cell.column}”: ${cell.raw.trim()} is negative; a nutrient content cannot be below zero.` });
      continue;
    }
    const nutrient = catalogue.find((n) => n.id === t);
    const to: NutrientUnit = nutrient ? nutrient.unit : '%';
    const from: NutrientUnit = field.mapping.unit === 'ppm' ? 'mg/kg' : field.mapping.unit;
    if (!canConvert(from, to)) continue; // reported once per field by checkMappings
    reported.push({ target: t, field, value: reading.value, converted: convertUnit(reading.value, from, to) });
  }
  const place = (r: { field: PreviewField }) => {
    const cell = at(r.field.key);
    return { line: cell?.line ?? sample.line, column: cell?.column ?? sample.column };
  };
  // Dry matter: reported, or 100 − moisture.
  const dmEntry = reported.find((r) => r.target === 'dm');
  const moisture = reported.find((r) => r.target === 'aux:moisture');
  let dm: number | null = dmEntry ? dmEntry.converted : moisture ? 100 - moisture.converted : null;
  if (dm !== null && !(dm > 0 && dm <= 100)) {
    const r = (dmEntry ?? moisture)!;
    issues.push({ severity: 'error', ...place(r), message: `${where(place(r))}: dry matter ${fmt(dm)} % is impossible; it must be above 0 and at most 100 %.` });
    dm = null;
  }
  const values: LabValue[] = [];
  const known: Record<string, number> = {};
  if (dm === null) {
    if (!issues.some((i) => i.message.startsWith('Dry matter is not mapped')) && (dmEntry || moisture || fieldFor('dm') || fieldFor('aux:moisture'))) {
      if (!dmEntry && !moisture) issues.push({ severity: 'error', line: sample.line, column: sample.column, message: `Sample “${sampleId}” (${placeWords(sample)}) has no dry matter: enter it in the file; values cannot be stored as fed without it.` });
    }
    return { sampleId, name, analysedOn, line: sample.line, column: sample.column, dryMatterPct: null, values, gaps: [], known };
  }
  known.dm = dm;
  const nutrientUnit = (id: string): NutrientUnit => catalogue.find((n) => n.id === id)?.unit ?? '%';
  values.push({ nutrientId: 'dm', asFed: dm, dryMatter: 100, unit: '%', origin: 'measured', fieldKey: (dmEntry ?? moisture)!.field.key, reported: { value: (dmEntry ?? moisture)!.value, unit: (dmEntry ?? moisture)!.field.mapping.unit, basis: 'as_fed' } });
  for (const r of reported) {
    if (r.target === 'dm' || r.target === 'aux:moisture') continue;
    const asFed = r.field.mapping.basis === 'dry_matter' ? dryMatterToAsFed(r.converted, dm) : r.converted;
    const key = r.target.startsWith('aux:') ? r.target.slice(4) : r.target;
    known[key] = asFed;
    if (r.target.startsWith('aux:')) continue;
    values.push({ nutrientId: r.target, asFed, dryMatter: onDryMatter(r.target, asFed, dm), unit: nutrientUnit(r.target), origin: 'measured', fieldKey: r.field.key, reported: { value: r.value, unit: r.field.mapping.unit, basis: r.field.mapping.basis } });
  }
  // Plausible ranges, judged per kg of dry matter.
  for (const v of values) {
    const entry = reported.find((r) => r.target === v.nutrientId);
    if (!entry) continue;
    const p = place(entry);
    const rule = PLAUSIBLE_MAX_ON_DM[v.nutrientId];
    if (rule && v.dryMatter > rule.max) {
      issues.push({ severity: 'error', ...p, message: `${where(p)}: ${targetName(v.nutrientId, catalogue)} is ${fmt(v.dryMatter)} % of dry matter, above the plausible ${rule.max} % (${rule.why}). Check the value, its unit and its basis.` });
    }
    const unit = v.unit;
    if ((unit === 'kcal/kg' || unit === 'MJ/kg') && convertUnit(v.dryMatter, unit, 'kcal/kg') > ENERGY_MAX_KCAL_DM) {
      issues.push({ severity: 'error', ...p, message: `${where(p)}: ${fmt(v.dryMatter)} ${unit} per kg of dry matter is above any feed (fats have about 9,400 kcal gross energy per kg). Check the value and its unit.` });
    }
    if (unit === '%' && !rule && v.dryMatter > 100) {
      issues.push({ severity: 'error', ...p, message: `${where(p)}: ${targetName(v.nutrientId, catalogue)} is ${fmt(v.dryMatter)} % of dry matter, more than the whole dry matter. Check the value, its unit and its basis.` });
    }
    const cp = known.cp;
    if (/^(dig_|sid_)?(lys|met|metcys|thr|trp|arg|ile|val|leu)$/.test(v.nutrientId) && cp !== undefined && v.asFed > cp) {
      issues.push({ severity: 'warning', ...p, message: `${where(p)}: ${targetName(v.nutrientId, catalogue)} (${fmt(v.asFed)} %) is above the crude protein (${fmt(cp)} %); right only for a crystalline amino acid.` });
    }
  }
  const proximate = PROXIMATE.filter((k) => known[k] !== undefined);
  const sumDm = proximate.reduce((s, k) => s + onDryMatter(k, known[k], dm!), 0);
  if (proximate.length >= 2 && sumDm > 100 + 1e-9) {
    const parts = proximate.map((k) => `${targetName(k, catalogue).split(' (')[0]} ${fmt(onDryMatter(k, known[k], dm!))}`).join(', ');
    issues.push({ severity: 'error', line: sample.line, column: sample.column, message: `Sample “${sampleId}” (${placeWords(sample)}): the proximate fractions add up to ${fmt(sumDm)} % of dry matter (${parts}), more than 100 %. Check their units and basis.` });
  }
  // Met + Cys from the two analyses when the lab gave them separately.
  if (known.metcys === undefined && known.met !== undefined && known.cys !== undefined && catalogue.some((n) => n.id === 'metcys')) {
    const asFed = known.met + known.cys;
    known.metcys = asFed;
    values.push({ nutrientId: 'metcys', asFed, dryMatter: onDryMatter('metcys', asFed, dm), unit: '%', origin: 'calculated', method: { kind: 'sum', id: 'met_plus_cys', name: 'Methionine + cystine, sum of the two analyses', source: 'common practice', confidence: 'derived' } });
  }
  return { sampleId, name, analysedOn, line: sample.line, column: sample.column, dryMatterPct: dm, values, gaps: [], known };
}

const placeWords = (s: LabSample) => (s.line !== null ? `line ${s.line}` : `column “${s.column}”`);
const where = (p: { line: number | null; column: string | null }) => `Line ${p.line}, column “${p.column}”`;

function fillGaps(sample: PreviewSample & { known: Record<string, number> }, request: PreviewRequest, catalogue: readonly CatalogueNutrient[], issues: LabIssue[]) {
  if (sample.dryMatterPct === null) return;
  const dm = sample.dryMatterPct;
  const known = new Set(catalogue.map((n) => n.id));
  const { estimates, gaps } = estimateGaps(sample.known, request.estimation ?? { classId: 'other' });
  sample.gaps = gaps.filter((g) => known.has(g.nutrientId));
  const overrides = request.overrides?.[sample.sampleId] ?? {};
  for (const e of estimates) {
    if (!known.has(e.nutrientId)) continue;
    const unit = catalogue.find((n) => n.id === e.nutrientId)!.unit;
    const over = overrides[e.nutrientId];
    if (over === null) continue;
    if (over !== undefined) sample.values.push({ nutrientId: e.nutrientId, asFed: over, dryMatter: onDryMatter(e.nutrientId, over, dm), unit, origin: 'override', method: e.method, estimatedAsFed: e.asFed });
    else sample.values.push({ nutrientId: e.nutrientId, asFed: e.asFed, dryMatter: onDryMatter(e.nutrientId, e.asFed, dm), unit, origin: 'estimated', method: e.method });
  }
  // An override for a gap no equation filled is the user's own value.
  for (const [nutrientId, value] of Object.entries(overrides)) {
    if (value === null || sample.values.some((v) => v.nutrientId === nutrientId)) continue;
    const nutrient = catalogue.find((n) => n.id === nutrientId);
    if (!nutrient) {
      issues.push({ severity: 'error', line: sample.line, column: sample.column, message: `“${nutrientId}” is not a nutrient Troughline keeps.` });
      continue;
    }
    if (!(value >= 0)) {
      issues.push({ severity: 'error', line: sample.line, column: sample.column, message: `The value entered for ${nutrient.name} of sample “${sample.sampleId}” must be a number of at least 0.` });
      continue;
    }
    sample.values.push({ nutrientId, asFed: value, dryMatter: onDryMatter(nutrientId, value, dm), unit: nutrient.unit, origin: 'override' });
    sample.gaps = sample.gaps.filter((g) => g.nutrientId !== nutrientId);
  }
}

/**
 * Reads a lab file and says what would be saved.
 * @param text the file as text
 * @param catalogue the nutrients values may be mapped to (id, name, unit)
 * @param remembered the mapping last used for this lab, applied before suggestions
 */
export function buildLabPreview(text: string, request: PreviewRequest, catalogue: readonly CatalogueNutrient[], remembered?: ColumnMapping): LabPreview {
  const csv = parseCsv(text, request);
  if (!csv.ok) return { ok: false, file: { bytes: csv.bytes, lines: 0, delimiter: null, decimal: null, hadBom: false, layout: null }, fields: [], samples: [], issues: csv.issues };
  const { grid } = csv;
  const issues: LabIssue[] = [...csv.issues];
  const known = new Set(catalogue.map((n) => n.id));
  const layout = request.layout && request.layout !== 'auto' ? request.layout : detectLayout(grid.rows, known);
  const built = buildTable(grid.rows, layout);
  issues.push(...built.issues);
  // Header cells are text too: a formula there is refused like anywhere else.
  grid.rows[0].forEach((h, i) => {
    if (isFormulaLike(h)) issues.push({ severity: 'error', line: 1, column: built.table.fields[i]?.key ?? null, message: `Line 1: the header “${h.trim().slice(0, 40)}” starts like a spreadsheet formula and was refused. Name the column in plain words.` });
  });
  const fields = resolveMappings(built.table.fields, request, remembered, catalogue, built.table.samples);
  issues.push(...checkMappings(fields, catalogue));
  const samples = built.table.samples.map((s) => readSample(s, fields, grid, catalogue, layout, issues));
  const seen = new Map<string, (typeof samples)[number]>();
  for (const s of samples) {
    const first = seen.get(s.sampleId);
    if (first) {
      const idField = fields.find((f) => f.mapping.target === 'sample_id');
      issues.push({ severity: 'error', line: s.line, column: idField?.key ?? s.column, message: `Sample id “${s.sampleId}” appears twice (${first.line !== null ? `lines ${first.line} and ${s.line}` : `columns “${first.column}” and “${s.column}”`}): each sample needs its own id.` });
    } else seen.set(s.sampleId, s);
  }
  for (const s of samples) fillGaps(s, request, catalogue, issues);
  const sorted = issues.sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
  return {
    ok: !sorted.some((i) => i.severity === 'error'),
    file: { bytes: grid.bytes, lines: grid.rows.length, delimiter: grid.delimiter, decimal: grid.decimal, hadBom: grid.hadBom, layout },
    fields,
    samples: samples.map(({ known: _known, ...rest }) => rest),
    issues: sorted,
  };
}
