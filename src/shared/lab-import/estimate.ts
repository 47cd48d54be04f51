/**
 * Filling the gaps a lab leaves: energy from published prediction equations, digestible amino acids
 * from totals with stated digestibility coefficients for the ingredient's class. Each estimate names
 * its equation or coefficient and source; a gap that cannot be filled says why. Pure functions.
 */
import { applyEnergyEquation, energyEquation, type EnergyComposition, type EnergyEquation, type EnergyNutrientId } from '../energy-equations';
import type { SpeciesFamily } from '../library-terms';
import { asFedToDryMatter } from '../units';
import type { ValueMethod } from './types';

const AA = ['lys', 'met', 'metcys', 'thr', 'trp', 'arg', 'ile', 'val', 'leu'] as const;
type AminoAcid = (typeof AA)[number];

/** A set of digestibility coefficients (digestible ÷ total) for one class of ingredient and one animal family. */
export type DigestibilitySet = {
  id: string;
  family: SpeciesFamily;
  /** Ids get this prefix: `dig_` (poultry digestible) or `sid_` (pig SID). */
  prefix: 'dig_' | 'sid_';
  name: string;
  coefficients: Partial<Record<AminoAcid, number>>;
  source: string;
  confidence: 'verified' | 'derived' | 'from_memory';
  caution?: string;
};

const all = (c: number): Record<AminoAcid, number> => Object.fromEntries(AA.map((a) => [a, c])) as Record<AminoAcid, number>;
const ratio = (dig: number, total: number) => Math.round((dig / total) * 1000) / 1000;

/** Coefficients on file, each with its source. Conventional ingredients have none yet: enter digestible values or override. */
export const DIGESTIBILITY_SETS: readonly DigestibilitySet[] = [
  {
    id: 'bsf_defatted_pig_sid',
    family: 'swine',
    prefix: 'sid_',
    name: 'Defatted BSF larva meal, pigs: SID of crude protein 0.738',
    coefficients: all(0.738),
    source: 'Kim et al. (2023), defatted black soldier fly larva meal in pigs, SID of CP 0.738 (abstract; companion paper J. Anim. Sci. Technol. 65(5):1002)',
    confidence: 'verified',
    caution: 'One coefficient, measured for crude protein, is used for every amino acid.',
  },
  {
    id: 'bsf_partially_defatted_pig_sid',
    family: 'swine',
    prefix: 'sid_',
    name: 'Partially defatted BSF larva meal, growing pigs: SID of Arg 0.9376, Met 0.9132',
    coefficients: { arg: 0.9376, met: 0.9132 },
    source: 'ASAS abstract 228, "SID of partially defatted BSF larvae meal in growing pig diets" (Arg 93.76 %, Met 91.32 %; all essential AA above 82 %)',
    confidence: 'verified',
    caution: 'Only arginine and methionine are given in the abstract; other amino acids are left for you to enter.',
  },
  {
    id: 'bsf_defatted_poultry_dig',
    family: 'poultry',
    prefix: 'dig_',
    name: 'Defatted BSF meal: digestible ÷ total from a published composition table',
    coefficients: { lys: ratio(2.34, 3.04), met: ratio(0.64, 0.82), metcys: ratio(0.64 + 0.38, 0.82 + 0.49), thr: ratio(1.48, 2.03), arg: ratio(2.23, 2.64), ile: ratio(1.75, 2.21), val: ratio(2.53, 3.16) },
    source: 'Sci. Rep. (2025) article s41598-025-05624-7, Table 5: SID ÷ total amino acids of a commercial defatted BSF meal (e.g. Lys 2.34 / 3.04)',
    confidence: 'derived',
    caution: 'The table does not say for which animal the SID values were measured; presumed broilers.',
  },
  {
    id: 'bsf_poultry_aid',
    family: 'poultry',
    prefix: 'dig_',
    name: 'Partially defatted BSF meal, broilers: mean apparent ileal digestibility 0.77',
    coefficients: all(0.77),
    source: 'Schiavone et al. (2017), J. Anim. Sci. Biotechnol. 8:51 (abstract): AA apparent ileal digestibility 0.44–0.92, mean 0.77',
    confidence: 'verified',
    caution: 'An apparent (not standardized) mean over all amino acids: it tends to understate digestible values.',
  },
  {
    id: 'mealworm_poultry_sid',
    family: 'poultry',
    prefix: 'dig_',
    name: 'Yellow mealworm meal, broilers: mean SID coefficient 0.86',
    coefficients: all(0.86),
    source: 'Nascimento Filho et al. (2022), "Nutritional value of Tenebrio molitor larvae meal for broiler chickens: ME and SID AA" (mean SID coefficient of AA 0.86, 21-d broilers)',
    confidence: 'verified',
    caution: 'A mean over all amino acids.',
  },
];

/** Classes of ingredient for gap filling: which equation and which coefficients apply. */
export type EstimationClass = {
  id: string;
  label: string;
  /** Poultry AMEn equation id; null where none is validated. */
  poultryEquation: string | null;
  /** Pig DE / ME / NE from the Noblet-family equations. */
  swine: boolean;
  insect: boolean;
  digestibility: string[];
};

export const ESTIMATION_CLASSES: readonly EstimationClass[] = [
  { id: 'maize', label: 'Maize grain', poultryEquation: 'janssen_maize', swine: true, insect: false, digestibility: [] },
  { id: 'wheat', label: 'Wheat', poultryEquation: 'janssen_wheat', swine: true, insect: false, digestibility: [] },
  { id: 'triticale', label: 'Triticale', poultryEquation: 'janssen_triticale', swine: true, insect: false, digestibility: [] },
  { id: 'barley', label: 'Barley', poultryEquation: 'janssen_barley', swine: true, insect: false, digestibility: [] },
  { id: 'sorghum_low_tannin', label: 'Sorghum, tannin < 0.4 %', poultryEquation: 'janssen_sorghum_low_tannin', swine: true, insect: false, digestibility: [] },
  { id: 'sorghum_high_tannin', label: 'Sorghum, tannin > 1.0 %', poultryEquation: 'janssen_sorghum_high_tannin', swine: true, insect: false, digestibility: [] },
  { id: 'wheat_bran', label: 'Wheat bran or middlings', poultryEquation: 'janssen_wheat_bran', swine: true, insect: false, digestibility: [] },
  { id: 'rice_bran_extracted', label: 'Rice bran, solvent extracted', poultryEquation: 'janssen_rice_bran_extracted', swine: true, insect: false, digestibility: [] },
  { id: 'bakery', label: 'Bakery by-product', poultryEquation: 'janssen_bakery', swine: true, insect: false, digestibility: [] },
  { id: 'soybean_meal', label: 'Soybean meal', poultryEquation: 'soybean_meal_fibre', swine: true, insect: false, digestibility: [] },
  { id: 'fish_meal', label: 'Fish meal', poultryEquation: 'janssen_fish_meal', swine: true, insect: false, digestibility: [] },
  { id: 'meat_bone_meal', label: 'Meat and bone meal', poultryEquation: 'janssen_meat_bone_meal', swine: true, insect: false, digestibility: [] },
  { id: 'blood_meal_spray', label: 'Blood meal, spray dried', poultryEquation: 'janssen_blood_meal_spray', swine: true, insect: false, digestibility: [] },
  { id: 'feather_meal', label: 'Feather meal', poultryEquation: 'janssen_feather_meal', swine: true, insect: false, digestibility: [] },
  { id: 'poultry_offal', label: 'Poultry offal meal', poultryEquation: 'janssen_poultry_offal', swine: true, insect: false, digestibility: [] },
  { id: 'bsf_defatted', label: 'Black soldier fly larva meal, defatted', poultryEquation: null, swine: true, insect: true, digestibility: ['bsf_defatted_poultry_dig', 'bsf_defatted_pig_sid'] },
  { id: 'bsf_partially_defatted', label: 'Black soldier fly larva meal, partially defatted', poultryEquation: null, swine: true, insect: true, digestibility: ['bsf_poultry_aid', 'bsf_partially_defatted_pig_sid'] },
  { id: 'bsf_full_fat', label: 'Black soldier fly larva meal, full-fat', poultryEquation: null, swine: true, insect: true, digestibility: [] },
  { id: 'mealworm', label: 'Yellow mealworm meal', poultryEquation: null, swine: true, insect: true, digestibility: ['mealworm_poultry_sid'] },
  { id: 'other', label: 'Other (no equation)', poultryEquation: null, swine: false, insect: false, digestibility: [] },
];

export const INSECT_AMEN_MESSAGE =
  'No validated equation predicts the AMEn of an insect meal from its proximate analysis: the fish-meal and meat-and-bone-meal equations are biased by chitin and by N × 6.25. Enter a measured value (e.g. 14.87 MJ/kg DM for a partially defatted BSF meal, Schiavone et al. 2017), or choose an equation knowingly.';

export type EstimationSettings = {
  classId: string;
  /** Use this poultry equation instead of the class's own (an insect meal has none by default). */
  poultryEquation?: string | null;
  families?: SpeciesFamily[];
};

export type EstimatedValue = { nutrientId: string; asFed: number; method: ValueMethod };
export type Gap = { nutrientId: string; message: string };

const methodOf = (e: EnergyEquation, extraCaution?: string): ValueMethod => ({
  kind: 'equation',
  id: e.id,
  name: e.name,
  source: `${e.formula}. ${e.source}`,
  confidence: e.confidence,
  caution: [e.caution, extraCaution].filter(Boolean).join(' ') || undefined,
});

/**
 * Estimates what the lab did not report.
 * @param known values per kg as fed: catalogue ids (`dm`, `cp`, …, energies in kcal/kg) plus `adf`, `ndf`, `nfe` in %
 * @returns estimates (kcal/kg or % as fed) and the gaps left, each with its reason
 */
export function estimateGaps(known: Record<string, number>, settings: EstimationSettings): { estimates: EstimatedValue[]; gaps: Gap[] } {
  const cls = ESTIMATION_CLASSES.find((c) => c.id === settings.classId) ?? ESTIMATION_CLASSES[ESTIMATION_CLASSES.length - 1];
  const families = settings.families ?? ['poultry', 'swine'];
  const estimates: EstimatedValue[] = [];
  const gaps: Gap[] = [];
  const comp: EnergyComposition = { dm: known.dm, cp: known.cp, ee: known.ee, cf: known.cf, ash: known.ash, starch: known.starch, adf: known.adf, ndf: known.ndf, nfe: known.nfe, de: known.de_swine, me: known.me_swine };
  const energy = (id: EnergyNutrientId, equation: EnergyEquation | undefined, caution?: string): number | null => {
    if (!equation) return null;
    const r = applyEnergyEquation(equation, comp);
    if (!r.ok) {
      gaps.push({ nutrientId: id, message: r.message });
      return null;
    }
    estimates.push({ nutrientId: id, asFed: r.asFed, method: methodOf(equation, caution) });
    return r.asFed;
  };

  if (families.includes('poultry') && known.amen_poultry === undefined) {
    const chosen = settings.poultryEquation ?? cls.poultryEquation;
    const equation = chosen ? energyEquation(chosen) : undefined;
    if (!equation || equation.output !== 'amen_poultry') gaps.push({ nutrientId: 'amen_poultry', message: cls.insect ? INSECT_AMEN_MESSAGE : `No AMEn equation is on file for “${cls.label}”: enter a measured or table value.` });
    else energy('amen_poultry', equation, cls.insect ? 'Not validated for insect meals: chitin and N × 6.25 bias it.' : undefined);
  }

  if (families.includes('swine') && (known.de_swine === undefined || known.me_swine === undefined || known.ne_swine === undefined)) {
    if (!cls.swine) {
      for (const id of ['de_swine', 'me_swine', 'ne_swine']) if (known[id] === undefined) gaps.push({ nutrientId: id, message: `No pig energy equation is on file for “${cls.label}”: enter a measured or table value.` });
    } else {
      const caution = cls.insect ? 'Fitted on 61 conventional pig diets (Noblet et al. 1994), without insect meals.' : undefined;
      if (comp.de == null) comp.de = energy('de_swine', energyEquation('noblet_perez_de'), caution);
      if (comp.me == null && comp.de != null) comp.me = energy('me_swine', energyEquation('nrc1998_me_from_de'), caution);
      else if (comp.me == null) gaps.push({ nutrientId: 'me_swine', message: 'Pig ME needs DE: map DE, or the analyses that estimate it.' });
      if (known.ne_swine === undefined) {
        // NE from ME (NE1) when ME is known, else from DE.
        const viaMe = comp.me != null ? energyEquation('noblet_ne_from_me') : undefined;
        if (viaMe) energy('ne_swine', viaMe, caution);
        else if (comp.de != null) energy('ne_swine', energyEquation('noblet_ne_from_de'), caution);
        else gaps.push({ nutrientId: 'ne_swine', message: 'Pig NE needs DE or ME, with crude fat, starch, crude protein and ADF.' });
      }
    }
  }

  for (const setId of cls.digestibility) {
    const set = DIGESTIBILITY_SETS.find((s) => s.id === setId);
    if (!set || !families.includes(set.family)) continue;
    for (const aa of AA) {
      const coefficient = set.coefficients[aa];
      const id = `${set.prefix}${aa}`;
      if (coefficient === undefined || known[aa] === undefined || known[id] !== undefined || estimates.some((e) => e.nutrientId === id)) continue;
      estimates.push({
        nutrientId: id,
        asFed: known[aa] * coefficient,
        method: { kind: 'coefficient', id: set.id, name: `${set.name} (× ${coefficient})`, source: set.source, confidence: set.confidence, caution: set.caution },
      });
    }
  }
  return { estimates, gaps };
}

/** The dry-matter equivalent of an as-fed value (DM itself is 100 %). */
export function onDryMatter(nutrientId: string, asFed: number, dm: number): number {
  return nutrientId === 'dm' ? 100 : asFedToDryMatter(asFed, dm);
}
