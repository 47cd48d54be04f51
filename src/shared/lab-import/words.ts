/**
 * Suggestions from the words a lab puts in a header (or a row label): which Troughline nutrient the
 * field is, in which unit and on which basis. "Crude protein", "CP", "Protein (N x 6.25)", "CP % DM",
 * "Ca g/kg", "Zn ppm" are all understood. A suggestion is only a starting point the user can correct.
 */
import type { NutrientUnit } from '../library-terms';
import { IGNORE, type FieldTargetId, type ReportBasis, type SourceUnit } from './types';

/** Words for each target, most specific first. Matching is on whole words after normalising. */
const TARGET_WORDS: [FieldTargetId, string[]][] = [
  ['sample_id', ['sample id', 'sample no', 'sample number', 'sample code', 'sample ref', 'lab id', 'lab no', 'lab number', 'lab ref', 'batch', 'batch no', 'lot', 'lot no', 'sample', 'id', 'ref', 'reference', 'code']],
  ['sample_name', ['description', 'sample name', 'sample description', 'name', 'product', 'material', 'feed', 'ingredient']],
  ['analysed_on', ['date analysed', 'date analyzed', 'analysis date', 'analysed on', 'analyzed on', 'date of analysis', 'date reported', 'report date', 'date']],
  ['dm', ['dry matter', 'dm', 'dry substance', 'total solids']],
  ['aux:moisture', ['moisture', 'water', 'h2o']],
  ['cp', ['crude protein', 'protein n x 6 25', 'n x 6 25', 'protein', 'cp', 'kjeldahl protein', 'dumas protein']],
  ['ee', ['ether extract', 'crude fat', 'crude fat ether extract', 'fat', 'oil', 'ee', 'lipid', 'lipids', 'total fat', 'acid hydrolysed fat', 'acid hydrolyzed fat']],
  ['cf', ['crude fibre', 'crude fiber', 'cf', 'fibre', 'fiber']],
  ['adf', ['adf', 'adfom', 'acid detergent fibre', 'acid detergent fiber', 'acid detergent fibre organic matter', 'acid detergent fiber organic matter']],
  ['ndf', ['ndf', 'andf', 'ndfom', 'andfom', 'neutral detergent fibre', 'neutral detergent fiber', 'amylase neutral detergent fibre', 'amylase neutral detergent fiber', 'amylase treated ndf', 'amylase ndf']],
  ['aux:nfe', ['nfe', 'nitrogen free extract']],
  ['ash', ['ash', 'crude ash', 'total ash', 'ca ash']],
  ['starch', ['starch', 'total starch']],
  ['chitin', ['chitin']],
  ['lauric', ['lauric acid', 'lauric', 'c12 0', 'c12']],
  ['linoleic', ['linoleic acid', 'linoleic', 'c18 2', 'c18 2n6', 'c18 2 n 6']],
  ['ca', ['calcium', 'ca']],
  ['avp', ['available phosphorus', 'available p', 'non phytate phosphorus', 'non phytate p', 'nonphytate p', 'npp', 'avp']],
  ['sttd_p', ['sttd p', 'sttd phosphorus', 'standardized total tract digestible phosphorus', 'standardised total tract digestible phosphorus']],
  ['p', ['total phosphorus', 'phosphorus', 'total p', 'p']],
  ['na', ['sodium', 'na']],
  ['cl', ['chloride', 'chlorine', 'cl']],
  ['k', ['potassium', 'k']],
  ['amen_poultry', ['amen', 'ame n', 'amen poultry', 'poultry amen', 'poultry me', 'me poultry', 'amen broiler']],
  ['ne_swine', ['ne', 'net energy', 'ne swine', 'ne pig', 'ne pigs', 'pig ne']],
  ['me_swine', ['me swine', 'me pig', 'me pigs', 'pig me', 'swine me']],
  ['de_swine', ['de', 'digestible energy', 'de swine', 'de pig', 'de pigs', 'pig de']],
];

/** Amino acids: code and words. `metcys` before `met` so "methionine + cystine" is not read as methionine. */
const AMINO_ACID_WORDS: [string, string[]][] = [
  ['metcys', ['methionine + cystine', 'methionine + cysteine', 'methionine cystine', 'methionine cysteine', 'met cys', 'met+cys', 'm c', 'sulphur amino acids', 'sulfur amino acids', 'saa', 'tsaa']],
  ['lys', ['lysine', 'lys']],
  ['met', ['methionine', 'met']],
  ['thr', ['threonine', 'thr']],
  ['trp', ['tryptophan', 'trp']],
  ['arg', ['arginine', 'arg']],
  ['ile', ['isoleucine', 'ile']],
  ['val', ['valine', 'val']],
  ['leu', ['leucine', 'leu']],
  ['aux:cys', ['cystine', 'cysteine', 'cys']],
];

const UNIT_PATTERNS: [RegExp, SourceUnit][] = [
  [/kcal\s*\/\s*kg|kcal/, 'kcal/kg'],
  [/mj\s*\/\s*kg|\bmj\b/, 'MJ/kg'],
  [/\biu\s*\/\s*kg|\bi\.?u\.?\b/, 'IU/kg'],
  [/mg\s*\/\s*kg/, 'mg/kg'],
  [/\bppm\b/, 'ppm'],
  [/\bg\s*\/\s*kg\b/, 'g/kg'],
  [/g\s*\/\s*100\s*g|%|\bpercent\b|\bpct\b/, '%'],
];

/** Lower case, no accents, "×" as x, every other mark a space. */
export function normaliseLabel(label: string): string {
  return label
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/×/g, ' x ')
    .replace(/[^a-z0-9%/+]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
}

/** The unit named in a header or unit cell, if any. */
export function unitFromText(text: string): SourceUnit | null {
  const s = text.toLowerCase();
  for (const [re, unit] of UNIT_PATTERNS) if (re.test(s)) return unit;
  return null;
}

const DM_BASIS = /(\bon (a )?(dm|dry matter)( basis)?\b|\b(dm|dry matter|dry) basis\b|%\s*(of\s*)?dm\b|\b(g|mg)\s*\/\s*kg\s*dm\b|\bin dm\b|\(dm\)|\bdmb\b|\bdb\b|\bppm dm\b)/;
const AS_FED_BASIS = /(\bas[- ]?fed\b|\bas[- ]?is\b|\bas[- ]?received\b|\bas[- ]?sampled\b|\bfresh( weight| matter)?\b|\bafb\b)/;

/** The basis named in a header, unit or basis cell, if any. */
export function basisFromText(text: string): ReportBasis | null {
  const s = text.toLowerCase();
  if (AS_FED_BASIS.test(s)) return 'as_fed';
  if (DM_BASIS.test(s) || /^\s*(dm|dry matter|dry)\s*$/.test(s)) return 'dry_matter';
  return null;
}

const containsPhrase = (haystack: string, phrase: string) => ` ${haystack} `.includes(` ${phrase} `);

function matchWords(core: string, table: [string, string[]][]): { target: string; length: number; exact: boolean } | null {
  let best: { target: string; length: number; exact: boolean } | null = null;
  for (const [target, words] of table) {
    for (const w of words) {
      const phrase = normaliseLabel(w);
      if (!phrase) continue;
      const exact = core === phrase;
      if (exact || containsPhrase(core, phrase)) {
        if (!best || (exact && !best.exact) || (exact === best.exact && phrase.length > best.length)) best = { target, length: phrase.length, exact };
      }
    }
  }
  return best;
}

export type Suggestion = { target: FieldTargetId; unit: SourceUnit | null; basis: ReportBasis | null; confident: boolean };

/**
 * Catalogue nutrients that older catalogues lack but the import can still use as auxiliary analyses:
 * without them in `known` (or without `known`), ADF and NDF still feed the pig energy equations.
 */
const AUX_WHEN_NOT_IN_CATALOGUE: Record<string, FieldTargetId> = { adf: 'aux:adf', ndf: 'aux:ndf' };

/** The catalogue nutrient an estimate-only input stands for (`aux:adf` → `adf`), or null when it has none. */
export function nutrientOfAux(target: string): string | null {
  return Object.entries(AUX_WHEN_NOT_IN_CATALOGUE).find(([, aux]) => aux === target)?.[0] ?? null;
}

/**
 * Suggests what a header (or row label) is.
 * @param label the field as the lab wrote it
 * @param known catalogue nutrient ids: suggestions outside it become `ignore`
 */
export function suggestField(label: string, known?: ReadonlySet<string>): Suggestion {
  const unit = unitFromText(label);
  const basis = basisFromText(label);
  let core = normaliseLabel(label.replace(/\((?:[^)]*)\)/g, (m) => (/n\s*[x×*]\s*6[.,]25/i.test(m) ? m : ' ')));
  core = core
    .replace(/kcal\s*\/\s*kg|mj\s*\/\s*kg|mg\s*\/\s*kg|g\s*\/\s*kg|g\s*\/\s*100\s*g|\bppm\b|%|\bpercent\b|\bpct\b|\biu\b/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
  const resolve = (suggested: FieldTargetId, confident: boolean): Suggestion => {
    const target = AUX_WHEN_NOT_IN_CATALOGUE[suggested] && !known?.has(suggested) ? AUX_WHEN_NOT_IN_CATALOGUE[suggested] : suggested;
    return {
      target: known && !target.startsWith('aux:') && !['sample_id', 'sample_name', 'analysed_on', IGNORE].includes(target) && !known.has(target) ? IGNORE : target,
      unit,
      basis,
      confident,
    };
  };
  if (core === '') return resolve(IGNORE, false);
  if (/^(dm|dry matter|dry substance|total solids)$/.test(core)) return { ...resolve('dm', true), basis: null };
  const withoutBasis = core
    .replace(/\b(on )?(a )?(dm|dry matter|dry) basis\b|\bon dm\b|\bin dm\b|\bdmb\b|\bas (fed|is|received|sampled)\b|\bbasis\b/g, ' ')
    .replace(/\bdm\b$/, ' ')
    .replace(/\s+/g, ' ')
    .trim();
  const words = withoutBasis || core;
  // Digestible amino acids: a prefix word tells the basis, the rest names the amino acid.
  const sid = /\b(sid|standardi[sz]ed ileal( digestible)?)\b/.test(words);
  const dig = !sid && /\b(dig|digestible|true digestible|td)\b/.test(words);
  const aa = matchWords(words.replace(/\b(sid|standardi[sz]ed|ileal|dig|digestible|true|td|total)\b/g, ' ').replace(/\s+/g, ' ').trim(), AMINO_ACID_WORDS);
  const general = matchWords(words, TARGET_WORDS);
  if (aa && (!general || aa.length >= general.length || sid || dig)) {
    if (aa.target.startsWith('aux:')) return resolve(aa.target, aa.exact);
    return resolve(sid ? `sid_${aa.target}` : dig ? `dig_${aa.target}` : aa.target, true);
  }
  if (general) return resolve(general.target, general.exact || general.length >= 4);
  return resolve(IGNORE, false);
}

/** The unit a target is usually reported in when the file does not say. */
export function defaultUnitFor(target: FieldTargetId, catalogueUnit?: NutrientUnit): SourceUnit {
  if (catalogueUnit) return catalogueUnit;
  return '%';
}
