/**
 * Reference species, phases and requirement specifications, each with the published table it comes from.
 * Per bound: `verified` was read in the named source, `from_memory` is recalled and still to be confirmed.
 * Bounds are % of the feed or kcal/kg, as fed (the tables assume about 90 % dry matter).
 */
import type { Confidence, IngredientCategory, InsectSpecies, SpeciesFamily } from '../../../src/shared/library-terms';

export type ReferenceSpecies = { code: string; name: string; family: SpeciesFamily; sortOrder: number };

export type ReferencePhase = {
  code: string;
  speciesCode: string;
  name: string;
  span: string;
  ageFromDays?: number;
  ageToDays?: number;
  bodyWeightFromKg?: number;
  bodyWeightToKg?: number;
  sortOrder: number;
};

export type ReferenceBound = { nutrientId: string; min?: number; max?: number; confidence: Confidence; note?: string };
export type ReferenceRatio = { numeratorId: string; denominatorId: string; min?: number; max?: number; confidence: Confidence; note: string };
export type ReferenceCap = {
  scope: 'category' | 'insect_species';
  category?: IngredientCategory;
  insectSpecies?: InsectSpecies;
  maxPct: number;
  source: string;
  note?: string;
};

export type ReferenceSpecification = {
  code: string;
  speciesCode: string;
  phaseCode: string;
  name: string;
  source: string;
  notes?: string;
  feedIntakeGPerDay?: number;
  bounds: ReferenceBound[];
  ratios?: ReferenceRatio[];
  caps?: ReferenceCap[];
};

export const REFERENCE_SPECIES: ReferenceSpecies[] = [
  { code: 'broiler', name: 'Broiler chicken', family: 'poultry', sortOrder: 10 },
  { code: 'layer', name: 'Laying hen', family: 'poultry', sortOrder: 20 },
  { code: 'pullet', name: 'Pullet (replacement layer)', family: 'poultry', sortOrder: 30 },
  { code: 'grow-finish-pig', name: 'Growing-finishing pig', family: 'swine', sortOrder: 40 },
  { code: 'sow', name: 'Sow', family: 'swine', sortOrder: 50 },
];

export const REFERENCE_PHASES: ReferencePhase[] = [
  { code: 'broiler-starter', speciesCode: 'broiler', name: 'Starter', span: '0–3 weeks', ageFromDays: 0, ageToDays: 21, sortOrder: 10 },
  { code: 'broiler-grower', speciesCode: 'broiler', name: 'Grower', span: '3–6 weeks', ageFromDays: 21, ageToDays: 42, sortOrder: 20 },
  { code: 'broiler-finisher', speciesCode: 'broiler', name: 'Finisher', span: '6–8 weeks', ageFromDays: 42, ageToDays: 56, sortOrder: 30 },
  { code: 'layer-laying', speciesCode: 'layer', name: 'In lay', span: 'White-egg hens eating 100 g a day', sortOrder: 10 },
  { code: 'pullet-0-6', speciesCode: 'pullet', name: 'Chick', span: '0–6 weeks', ageFromDays: 0, ageToDays: 42, sortOrder: 10 },
  { code: 'pullet-6-12', speciesCode: 'pullet', name: 'Grower', span: '6–12 weeks', ageFromDays: 42, ageToDays: 84, sortOrder: 20 },
  { code: 'pullet-12-18', speciesCode: 'pullet', name: 'Developer', span: '12–18 weeks', ageFromDays: 84, ageToDays: 126, sortOrder: 30 },
  ...([
    [5, 7], [7, 11], [11, 25], [25, 50], [50, 75], [75, 100], [100, 135],
  ] as const).map(([from, to], i): ReferencePhase => ({
    code: `pig-${from}-${to}`, speciesCode: 'grow-finish-pig', name: `${from}–${to} kg`, span: `${from}–${to} kg body weight`, bodyWeightFromKg: from, bodyWeightToKg: to, sortOrder: 10 * (i + 1),
  })),
  { code: 'sow-gestation', speciesCode: 'sow', name: 'Gestation, parity 1', span: 'Before and after day 90 of gestation', sortOrder: 10 },
  { code: 'sow-lactation-p1', speciesCode: 'sow', name: 'Lactation, parity 1', span: '21-day lactation, litter gaining 230 g per piglet a day', sortOrder: 20 },
  { code: 'sow-lactation-p2', speciesCode: 'sow', name: 'Lactation, parity 2 and later', span: '21-day lactation, litter gaining 230 g per piglet a day', sortOrder: 30 },
];

// Broiler chickens, NRC (1994). Amino acids are TOTAL amino acids.
const BROILER_SOURCE = 'NRC (1994) Nutrient Requirements of Poultry, broiler table, as adapted in the Merck Veterinary Manual table “Nutrient Requirements of Broilers”';
const BROILER_MINERALS_NOTE = 'From memory of NRC (1994), to confirm';
const broilerColumns = {
  starter: { cp: 23, lys: 1.1, met: 0.5, metcys: 0.9, thr: 0.8, trp: 0.2, arg: 1.25, val: 0.9, ile: 0.8, leu: 1.2, ca: 1.0, avp: 0.45, na: 0.2, cl: 0.2, k: 0.3, linoleic: 1.0 },
  grower: { cp: 20, lys: 1.0, met: 0.38, metcys: 0.72, thr: 0.74, trp: 0.18, arg: 1.1, val: 0.82, ile: 0.73, leu: 1.09, ca: 0.9, avp: 0.35, na: 0.15, cl: 0.15, k: 0.3, linoleic: 1.0 },
  finisher: { cp: 18, lys: 0.85, met: 0.32, metcys: 0.6, thr: 0.68, trp: 0.16, arg: 1.0, val: 0.7, ile: 0.62, leu: 0.93, ca: 0.8, avp: 0.3, na: 0.12, cl: 0.12, k: 0.3, linoleic: 1.0 },
};
const BROILER_VERIFIED = new Set(['cp', 'lys', 'met', 'metcys', 'thr', 'trp', 'arg', 'val', 'ile', 'leu']);

function broilerBounds(column: Record<string, number>): ReferenceBound[] {
  return [
    { nutrientId: 'amen_poultry', min: 3200, confidence: 'verified', note: 'A typical dietary energy concentration, not a requirement' },
    ...Object.entries(column).map(([nutrientId, min]): ReferenceBound =>
      BROILER_VERIFIED.has(nutrientId)
        ? { nutrientId, min, confidence: 'verified', note: nutrientId === 'cp' ? 'No requirement for crude protein as such: a guide' : undefined }
        : { nutrientId, min, confidence: 'from_memory', note: BROILER_MINERALS_NOTE },
    ),
  ];
}

const BROILER_CA_AVP: ReferenceRatio = {
  numeratorId: 'ca', denominatorId: 'avp', min: 2.0, max: 2.2, confidence: 'from_memory',
  note: 'About 2 : 1 is common practice (Mello et al. 2012 held Ca : available P at 2 : 1); NRC 1994 starter 1.00 / 0.45 = 2.2',
};

// Suggested soft caps on insect meal: tested levels from feeding trials, not legal limits. Warn above, never block.
const BSF_BROILER: ReferenceCap = { scope: 'insect_species', insectSpecies: 'hermetia_illucens', maxPct: 10, source: 'Dabbou et al. 2018, J. Anim. Sci. Biotechnol.: partially defatted meal at 0, 5, 10, 15 % from day 1 to 35; growth best at 10 %' };
const TM_BROILER: ReferenceCap = { scope: 'insect_species', insectSpecies: 'tenebrio_molitor', maxPct: 7.5, source: 'Insects 2024, 15(12):979: 10 % low-fat mealworm meal reduced gain and worsened FCR; Biasato et al. 2018, Poult. Sci. 97: FCR rose with full-fat meal up to 15 %' };
const MD_BROILER: ReferenceCap = { scope: 'insect_species', insectSpecies: 'musca_domestica', maxPct: 8, source: 'Elahi et al. 2020, J. Anim. Physiol. Anim. Nutr. (doi 10.1111/jpn.13265): 0, 4, 8 % replacing soybean meal, no effect on weight or intake' };
const BSF_LAYER: ReferenceCap = { scope: 'insect_species', insectSpecies: 'hermetia_illucens', maxPct: 7.5, source: 'Mwaniki, Neijat & Kiarie 2018: defatted meal at 0, 5.0, 7.5 % from week 19 to 27; 7.5 % laid as well as the control' };
const BSF_PIGLET: ReferenceCap = { scope: 'insect_species', insectSpecies: 'hermetia_illucens', maxPct: 10, source: 'Biasato et al. 2019, J. Anim. Sci. Biotechnol. 10:12: partially defatted meal at 0, 5, 10 % in weaned piglets, no effect on growth or gut health' };
const BSF_FINISHER: ReferenceCap = { scope: 'insect_species', insectSpecies: 'hermetia_illucens', maxPct: 4, source: 'Yu et al. 2019, Chinese J. Anim. Nutr. 31(7):3330–3337: 8 % lowered crude protein digestibility in finishing gilts; 4 % did not' };

// Growing pigs, NRC (2012); SID amino acids. Bold columns of the fact sheet are verified, the rest from memory.
const PIG_SOURCE = 'NRC (2012) Nutrient Requirements of Swine, 11th rev. ed., growing-pig requirement tables (mixed sex, 90 % DM; table numbers to confirm)';
const PIG_BANDS = ['5-7', '7-11', '11-25', '25-50', '50-75', '75-100', '100-135'] as const;
const PIG_ROWS: Record<string, number[]> = {
  sid_lys: [1.5, 1.35, 1.23, 0.98, 0.85, 0.73, 0.61],
  sid_met: [0.43, 0.39, 0.36, 0.28, 0.25, 0.21, 0.18],
  sid_metcys: [0.82, 0.74, 0.68, 0.55, 0.48, 0.42, 0.36],
  sid_thr: [0.88, 0.79, 0.73, 0.59, 0.52, 0.46, 0.4],
  sid_trp: [0.25, 0.22, 0.2, 0.17, 0.15, 0.13, 0.11],
  sid_val: [0.95, 0.86, 0.78, 0.64, 0.55, 0.48, 0.4],
  sid_ile: [0.77, 0.69, 0.63, 0.51, 0.45, 0.39, 0.33],
  ca: [0.85, 0.8, 0.7, 0.66, 0.59, 0.52, 0.46],
  sttd_p: [0.45, 0.4, 0.33, 0.31, 0.27, 0.24, 0.21],
  na: [0.4, 0.35, 0.28, 0.1, 0.1, 0.1, 0.1],
  cl: [0.5, 0.45, 0.32, 0.08, 0.08, 0.08, 0.08],
};
/** Cells read in a source: nutrient → band index → where. */
const PIG_VERIFIED: Record<string, Record<number, string>> = {
  sttd_p: {
    2: 'Univ. Illinois Stein Monogastric Nutrition Lab (nutrition.ansci.illinois.edu/node/1055)',
    3: 'Vier et al. 2019, J. Anim. Sci. 97:4023–4031, Table 2 footnotes',
    4: 'Vier et al. 2019, J. Anim. Sci. 97:4023–4031, Table 2 footnotes',
    5: 'Vier et al. 2019, J. Anim. Sci. 97:4023–4031, Table 2 footnotes',
    6: 'Vier et al. 2019, J. Anim. Sci. 97:4023–4031, Table 2 footnotes',
  },
  na: { 1: 'Shawk et al., Kansas State, National Hog Farmer, 15 Mar 2017' },
  cl: { 1: 'Shawk et al., Kansas State, National Hog Farmer, 15 Mar 2017' },
};

function pigSpecification(band: (typeof PIG_BANDS)[number], index: number): ReferenceSpecification {
  const bounds: ReferenceBound[] = [
    { nutrientId: 'ne_swine', min: 2448, confidence: 'from_memory', note: 'Diet energy the table assumes (DE 3,542, ME 3,400, NE 2,448 kcal/kg), from memory' },
    ...Object.entries(PIG_ROWS).map(([nutrientId, row]): ReferenceBound => {
      const where = PIG_VERIFIED[nutrientId]?.[index];
      return where ? { nutrientId, min: row[index], confidence: 'verified', note: `Checked: ${where}` } : { nutrientId, min: row[index], confidence: 'from_memory', note: 'From memory of NRC (2012), to confirm' };
    }),
  ];
  const caps = index <= 2 ? [BSF_PIGLET] : index >= 4 ? [BSF_FINISHER] : [];
  return {
    code: `nrc2012-pig-${band}`,
    speciesCode: 'grow-finish-pig',
    phaseCode: `pig-${band}`,
    name: `Growing pig ${band.replace('-', '–')} kg`,
    source: PIG_SOURCE,
    bounds,
    ratios: [{ numeratorId: 'ca', denominatorId: 'sttd_p', max: 2.15, confidence: 'verified', note: 'NRC 2012 sets total Ca at 2.15 × STTD P (Stein Monogastric Nutrition Lab); used here as an upper limit' }],
    caps,
  };
}

const SOW_SOURCE = 'NRC (2012) with a 10 % safety margin on amino acids, Ca and STTD P: Table 6.3 in The Gestating and Lactating Sow (C. Farmer, ed., Wageningen Academic, 2015)';

function sowLactation(parity: 'p1' | 'p2', values: Record<string, number>): ReferenceSpecification {
  return {
    code: `sow-lactation-${parity}`,
    speciesCode: 'sow',
    phaseCode: `sow-lactation-${parity}`,
    name: parity === 'p1' ? 'Lactating sow, parity 1 (230 g/d piglet gain)' : 'Lactating sow, parity 2+ (230 g/d piglet gain)',
    source: SOW_SOURCE,
    notes: 'Feed intake (with 5 % waste) ' + (parity === 'p1' ? '5.95' : '6.61') + ' kg a day; effective ME 3,300 and NE 2,518 kcal/kg.',
    bounds: [
      { nutrientId: 'ne_swine', min: 2518, confidence: 'verified', note: 'Effective NE of the table' },
      ...Object.entries(values).map(([nutrientId, min]): ReferenceBound => ({ nutrientId, min, confidence: 'verified' })),
    ],
  };
}

export const REFERENCE_SPECIFICATIONS: ReferenceSpecification[] = [
  {
    code: 'nrc1994-broiler-starter', speciesCode: 'broiler', phaseCode: 'broiler-starter', name: 'Broiler starter, 0–3 weeks', source: BROILER_SOURCE,
    notes: 'Total amino acids. Modern broilers need more lysine for maximal growth and efficiency (note of the source).',
    bounds: broilerBounds(broilerColumns.starter), ratios: [BROILER_CA_AVP], caps: [BSF_BROILER, TM_BROILER, MD_BROILER],
  },
  {
    code: 'nrc1994-broiler-grower', speciesCode: 'broiler', phaseCode: 'broiler-grower', name: 'Broiler grower, 3–6 weeks', source: BROILER_SOURCE,
    notes: 'Total amino acids. Modern broilers need more lysine for maximal growth and efficiency (note of the source).',
    bounds: broilerBounds(broilerColumns.grower), ratios: [BROILER_CA_AVP], caps: [BSF_BROILER, TM_BROILER, MD_BROILER],
  },
  {
    code: 'nrc1994-broiler-finisher', speciesCode: 'broiler', phaseCode: 'broiler-finisher', name: 'Broiler finisher, 6–8 weeks', source: BROILER_SOURCE,
    notes: 'Total amino acids. Modern broilers need more lysine for maximal growth and efficiency (note of the source).',
    bounds: broilerBounds(broilerColumns.finisher), ratios: [BROILER_CA_AVP], caps: [BSF_BROILER, TM_BROILER, MD_BROILER],
  },
  {
    code: 'nrc1994-layer-100g', speciesCode: 'layer', phaseCode: 'layer-laying', name: 'Laying hen, white-egg, 100 g/day intake',
    source: 'NRC (1994) Nutrient Requirements of Poultry, laying-hen table (Table 2-4, to confirm); 15 g protein a day checked in summaries of NRC 1994',
    notes: 'Per cent of the diet at 100 g of feed a day. At another intake the daily amounts stay the same: % = mg a day ÷ intake (g) ÷ 10.',
    feedIntakeGPerDay: 100,
    bounds: [
      { nutrientId: 'amen_poultry', min: 2900, confidence: 'from_memory', note: 'Typical ME, from memory' },
      { nutrientId: 'cp', min: 15, confidence: 'verified', note: '15 g protein a day at 100 g intake' },
      ...Object.entries({ lys: 0.69, met: 0.3, metcys: 0.58, thr: 0.47, trp: 0.16, arg: 0.7, ile: 0.65, val: 0.7, ca: 3.25, avp: 0.25, na: 0.15, cl: 0.13, linoleic: 1.0 }).map(
        ([nutrientId, min]): ReferenceBound => ({ nutrientId, min, confidence: 'from_memory', note: 'From memory of NRC (1994), to confirm' }),
      ),
    ],
    caps: [BSF_LAYER],
  },
  ...PIG_BANDS.map(pigSpecification),
  {
    code: 'sow-gestation-p1', speciesCode: 'sow', phaseCode: 'sow-gestation', name: 'Gestating sow, parity 1, before day 90',
    source: 'NRC (2012) Nutrient Requirements of Swine, gestation requirements (from memory, to confirm)',
    notes: 'After day 90 SID lysine rises to about 0.69 % (from memory): use a second specification for late gestation.',
    bounds: [
      { nutrientId: 'ne_swine', min: 2518, confidence: 'from_memory' },
      { nutrientId: 'sid_lys', min: 0.52, confidence: 'from_memory', note: 'Before day 90; from memory' },
    ],
  },
  sowLactation('p1', { sid_lys: 0.89, sid_met: 0.23, sid_metcys: 0.47, sid_thr: 0.56, sid_trp: 0.17, sid_ile: 0.5, sid_val: 0.76, ca: 0.78, sttd_p: 0.4 }),
  sowLactation('p2', { sid_lys: 0.87, sid_met: 0.23, sid_metcys: 0.45, sid_thr: 0.54, sid_trp: 0.17, sid_ile: 0.47, sid_val: 0.73, ca: 0.75, sttd_p: 0.37 }),
];
