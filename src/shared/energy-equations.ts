/**
 * Published equations that predict an ingredient's energy from its proximate analysis, for when a lab
 * report gives the composition but no energy. Pure functions, no framework imports.
 *
 * Conventions:
 * - Compositions passed in are per kg **as fed**, in % of the feed (`dm` is the dry matter, %).
 * - Every result is kcal/kg, given both as fed and per kg of dry matter.
 * - Each equation carries its name, the publication it comes from, how far its coefficients were
 *   checked (`confidence`), and the basis it must be applied on:
 *   - `homogeneous`: no intercept, so the same equation gives kcal/kg DM from % DM and kcal/kg as fed from
 *     % as fed (derived: every term is of degree 1);
 *   - `dry_matter`: has an intercept and is applied to % DM giving kcal/kg DM, the basis named in the title of
 *     its table; the equation's own paper was not read, so the result carries a caution;
 *   - `fixed_dm`: has an intercept and was fitted at a stated dry matter (`fixedDmPct`): inputs and
 *     output are first put on that dry matter.
 * - NFE (nitrogen-free extract) is DM − CP − EE − CF − ash when the lab did not report it (its definition).
 * - Swine equations of the Noblet family take nutrients in g/kg DM and energy in kcal/kg DM.
 */
import { asFedToDryMatter, dryMatterToAsFed } from './units';

/** Energy nutrients of the catalogue an equation can estimate. */
export type EnergyNutrientId = 'amen_poultry' | 'de_swine' | 'me_swine' | 'ne_swine';

/**
 * Inputs an equation can use. All but energies are % of the feed as fed (starch, ADF, NDF included);
 * `de` and `me` are kcal/kg as fed (swine DE and ME, measured or estimated first).
 */
export type EnergyInput = 'dm' | 'cp' | 'ee' | 'cf' | 'ash' | 'nfe' | 'starch' | 'adf' | 'ndf' | 'de' | 'me';

export type EnergyComposition = Partial<Record<EnergyInput, number | null>>;

export type EquationBasis = 'homogeneous' | 'dry_matter' | 'fixed_dm';

export type EnergyEquation = {
  id: string;
  output: EnergyNutrientId;
  /** Short name shown beside every estimated value, e.g. "Maize grain AMEn (Janssen 1989)". */
  name: string;
  /** The equation as printed, in words and symbols. */
  formula: string;
  /** Where it is printed (table, page). */
  source: string;
  /** `verified`: coefficients read in the source; `from_memory`: recalled, to be checked against the print. */
  confidence: 'verified' | 'from_memory';
  basis: EquationBasis;
  /** For `fixed_dm` equations: the dry matter the equation assumes, %. */
  fixedDmPct?: number;
  inputs: readonly EnergyInput[];
  /** Shown with the estimate, e.g. when the basis of an intercept is uncertain. */
  caution?: string;
  /**
   * The equation itself. `x` holds the inputs on the equation's basis: % (or kcal/kg) on DM for
   * `homogeneous` and `dry_matter` (with `dm` = 100), on `fixedDmPct` for `fixed_dm`.
   * Returns kcal/kg on the same basis.
   */
  compute: (x: Record<EnergyInput, number>) => number;
};

const NRC_1994_B1 = 'NRC (1994) Nutrient Requirements of Poultry, 9th rev. ed., Appendix B, Table B-1 (p. 114)';
const janssen = (what: string) => `${NRC_1994_B1}, citing Janssen (1989), European Table of Energy Values for Poultry Feedstuffs (WPSA): ${what}`;
const janssen79 = (what: string) => `${NRC_1994_B1}, citing Janssen et al. (1979): ${what}`;
const INTERCEPT_CAUTION = 'This equation has an intercept, so its basis matters; it is applied on dry matter as the title of its table says. Check it against a measured value before relying on it.';

/** Every equation Troughline can apply, by id. */
export const ENERGY_EQUATIONS: readonly EnergyEquation[] = [
  // Poultry AMEn, NRC (1994) Table B-1 (kcal/kg; components in %).
  { id: 'janssen_maize', output: 'amen_poultry', name: 'Maize grain AMEn (Janssen 1989)', formula: 'AMEn = 36.21 CP + 85.44 EE + 37.26 NFE', source: janssen('corn grain'), confidence: 'verified', basis: 'homogeneous', inputs: ['cp', 'ee', 'nfe'], compute: (x) => 36.21 * x.cp + 85.44 * x.ee + 37.26 * x.nfe },
  { id: 'janssen_sorghum_low_tannin', output: 'amen_poultry', name: 'Sorghum, tannin < 0.4 %, AMEn (Janssen 1989)', formula: 'AMEn = 31.02 CP + 77.03 EE + 37.67 NFE', source: janssen('sorghum, tannin < 0.4 %'), confidence: 'verified', basis: 'homogeneous', inputs: ['cp', 'ee', 'nfe'], compute: (x) => 31.02 * x.cp + 77.03 * x.ee + 37.67 * x.nfe },
  { id: 'janssen_sorghum_high_tannin', output: 'amen_poultry', name: 'Sorghum, tannin > 1.0 %, AMEn (Janssen 1989)', formula: 'AMEn = 21.98 CP + 54.75 EE + 35.18 NFE', source: janssen('sorghum, tannin > 1.0 %'), confidence: 'verified', basis: 'homogeneous', inputs: ['cp', 'ee', 'nfe'], compute: (x) => 21.98 * x.cp + 54.75 * x.ee + 35.18 * x.nfe },
  { id: 'janssen_triticale', output: 'amen_poultry', name: 'Triticale AMEn (Janssen 1989)', formula: 'AMEn = 34.49 CP + 62.16 EE + 35.61 NFE', source: janssen('triticale'), confidence: 'verified', basis: 'homogeneous', inputs: ['cp', 'ee', 'nfe'], compute: (x) => 34.49 * x.cp + 62.16 * x.ee + 35.61 * x.nfe },
  { id: 'janssen_wheat', output: 'amen_poultry', name: 'Wheat AMEn (Janssen 1989)', formula: 'AMEn = 34.92 CP + 63.1 EE + 36.42 NFE', source: janssen('wheat'), confidence: 'verified', basis: 'homogeneous', inputs: ['cp', 'ee', 'nfe'], compute: (x) => 34.92 * x.cp + 63.1 * x.ee + 36.42 * x.nfe },
  { id: 'janssen_wheat_bran', output: 'amen_poultry', name: 'Wheat middlings and bran AMEn (Janssen 1989)', formula: 'AMEn = 40.1 DM − 40.1 ash − 165.39 CF', source: janssen('wheat middlings, wheat bran'), confidence: 'verified', basis: 'homogeneous', inputs: ['dm', 'ash', 'cf'], compute: (x) => 40.1 * x.dm - 40.1 * x.ash - 165.39 * x.cf },
  { id: 'janssen_wheat_products_meal', output: 'amen_poultry', name: 'Wheat products, meal form, AMEn (Janssen et al. 1979)', formula: 'AMEn = 3,985 − 205 CF', source: janssen79('wheat and wheat products, meal form'), confidence: 'verified', basis: 'dry_matter', inputs: ['cf'], caution: INTERCEPT_CAUTION, compute: (x) => 3985 - 205 * x.cf },
  { id: 'janssen_barley', output: 'amen_poultry', name: 'Barley and barley products AMEn (Janssen et al. 1979)', formula: 'AMEn = 3,078 − 90.4 CF + 9.2 starch', source: janssen79('barley and barley products'), confidence: 'verified', basis: 'dry_matter', inputs: ['cf', 'starch'], caution: INTERCEPT_CAUTION, compute: (x) => 3078 - 90.4 * x.cf + 9.2 * x.starch },
  { id: 'janssen_rice_bran_extracted', output: 'amen_poultry', name: 'Rice bran, solvent extracted, AMEn (Janssen 1989)', formula: 'AMEn = 46.7 DM − 46.7 ash − 69.54 CP + 42.94 EE − 81.95 CF', source: janssen('rice bran, solvent extracted'), confidence: 'verified', basis: 'homogeneous', inputs: ['dm', 'ash', 'cp', 'ee', 'cf'], compute: (x) => 46.7 * x.dm - 46.7 * x.ash - 69.54 * x.cp + 42.94 * x.ee - 81.95 * x.cf },
  { id: 'janssen_bakery', output: 'amen_poultry', name: 'Bakery by-product AMEn (Janssen 1989)', formula: 'AMEn = 34.49 CP + 76.1 EE + 37.67 NFE', source: janssen('bakery by-product'), confidence: 'verified', basis: 'homogeneous', inputs: ['cp', 'ee', 'nfe'], compute: (x) => 34.49 * x.cp + 76.1 * x.ee + 37.67 * x.nfe },
  { id: 'janssen_meat_bone_meal', output: 'amen_poultry', name: 'Meat and bone meal AMEn (Janssen 1989)', formula: 'AMEn = 33.94 DM − 45.77 ash + 59.99 EE', source: `${janssen('meat and bone meal')} (the table prints "= 45.77", read as "− 45.77")`, confidence: 'verified', basis: 'homogeneous', inputs: ['dm', 'ash', 'ee'], compute: (x) => 33.94 * x.dm - 45.77 * x.ash + 59.99 * x.ee },
  { id: 'janssen_fish_meal', output: 'amen_poultry', name: 'Fish meal AMEn (Janssen 1989)', formula: 'AMEn = 35.87 DM − 34.08 ash + 42.09 EE', source: janssen('fish meal (60, 65, 67 % CP)'), confidence: 'verified', basis: 'homogeneous', inputs: ['dm', 'ash', 'ee'], compute: (x) => 35.87 * x.dm - 34.08 * x.ash + 42.09 * x.ee },
  { id: 'janssen_blood_meal_spray', output: 'amen_poultry', name: 'Blood meal, spray dried, AMEn (Janssen 1989)', formula: 'AMEn = 34.49 CP + 64.96 EE', source: janssen('blood meal, spray dried'), confidence: 'verified', basis: 'homogeneous', inputs: ['cp', 'ee'], compute: (x) => 34.49 * x.cp + 64.96 * x.ee },
  { id: 'janssen_feather_meal', output: 'amen_poultry', name: 'Feather meal AMEn (Janssen 1989)', formula: 'AMEn = 33.2 CP + 57.53 EE', source: janssen('feather meal (pepsin digestibility 80 %)'), confidence: 'verified', basis: 'homogeneous', inputs: ['cp', 'ee'], compute: (x) => 33.2 * x.cp + 57.53 * x.ee },
  { id: 'janssen_poultry_offal', output: 'amen_poultry', name: 'Poultry offal meal AMEn (Janssen 1989)', formula: 'AMEn = 31.02 CP + 74.23 EE', source: janssen('poultry offal meal'), confidence: 'verified', basis: 'homogeneous', inputs: ['cp', 'ee'], compute: (x) => 31.02 * x.cp + 74.23 * x.ee },
  {
    id: 'soybean_meal_fibre',
    output: 'amen_poultry',
    name: 'Soybean meal ME from crude fibre (UGA Poultry Extension)',
    formula: 'ME = 2,778 − 66 CF, at 88 % DM',
    source: 'University of Georgia Poultry Extension, "Soybeans: metabolizable energy" (r² = 0.61; worked example CF 4.8 % → 2,461 kcal/kg)',
    confidence: 'verified',
    basis: 'fixed_dm',
    fixedDmPct: 88,
    inputs: ['cf'],
    caution: 'Gives ME, used here as AMEn; r² = 0.61.',
    compute: (x) => 2778 - 66 * x.cf,
  },
  // Swine. Noblet family: nutrients g/kg DM, energy kcal/kg DM.
  {
    id: 'noblet_perez_de',
    output: 'de_swine',
    name: 'Pig DE from composition (Noblet & Perez 1993)',
    formula: 'DE = 4,168 − 9.1 ash + 1.9 CP + 3.9 EE − 3.6 NDF (g/kg DM)',
    source: 'Noblet & Perez (1993), J. Anim. Sci. 71:3389, as used by NRC (2012) Nutrient Requirements of Swine; coefficients from memory',
    confidence: 'from_memory',
    basis: 'dry_matter',
    inputs: ['ash', 'cp', 'ee', 'ndf'],
    caution: 'Coefficients recalled, not yet checked against the paper.',
    compute: (x) => 4168 - 9.1 * g(x.ash) + 1.9 * g(x.cp) + 3.9 * g(x.ee) - 3.6 * g(x.ndf),
  },
  {
    id: 'nrc1998_me_from_de',
    output: 'me_swine',
    name: 'Pig ME from DE (NRC 1998)',
    formula: 'ME = DE × (1.012 − 0.0019 CP %)',
    source: 'NRC (1998) Nutrient Requirements of Swine, 10th rev. ed.; from memory (NRC 2012 uses a different correction)',
    confidence: 'from_memory',
    basis: 'dry_matter',
    inputs: ['de', 'cp'],
    caution: 'Coefficients recalled, not yet checked against the print.',
    compute: (x) => x.de * (1.012 - 0.0019 * x.cp),
  },
  {
    id: 'noblet_ne_from_me',
    output: 'ne_swine',
    name: 'Pig NE from ME (Noblet et al. 1994)',
    formula: 'NE = 0.726 ME + 1.33 EE + 0.39 starch − 0.62 CP − 0.83 ADF (kcal/kg DM, g/kg DM)',
    source: 'Noblet et al. (1994), J. Anim. Sci. 72:344, equation NE7, as given by NRC (2012) Nutrient Requirements of Swine ("NE1" in the Pork Information Gateway factsheet "Composition and usage rate")',
    confidence: 'verified',
    basis: 'homogeneous',
    inputs: ['me', 'ee', 'starch', 'cp', 'adf'],
    compute: (x) => 0.726 * x.me + 1.33 * g(x.ee) + 0.39 * g(x.starch) - 0.62 * g(x.cp) - 0.83 * g(x.adf),
  },
  {
    id: 'noblet_ne_from_de',
    output: 'ne_swine',
    name: 'Pig NE from DE (Noblet et al. 1994)',
    formula: 'NE = 0.700 DE + 1.61 EE + 0.48 starch − 0.91 CP − 0.87 ADF (kcal/kg DM, g/kg DM)',
    source: 'Noblet et al. (1994), J. Anim. Sci. 72:344, as printed in MJ form by Li et al. (2018), J. Anim. Sci. Biotechnol. 9:39, Fig. 5 ("INRA prediction equation")',
    confidence: 'verified',
    basis: 'homogeneous',
    inputs: ['de', 'ee', 'starch', 'cp', 'adf'],
    compute: (x) => 0.7 * x.de + 1.61 * g(x.ee) + 0.48 * g(x.starch) - 0.91 * g(x.cp) - 0.87 * g(x.adf),
  },
];

/** % → g/kg. */
function g(percent: number): number {
  return percent * 10;
}

const BY_ID = new Map(ENERGY_EQUATIONS.map((e) => [e.id, e]));

/** The equation with this id, or undefined. */
export function energyEquation(id: string): EnergyEquation | undefined {
  return BY_ID.get(id);
}

/** Names of the inputs, for messages. */
export const ENERGY_INPUT_LABELS: Record<EnergyInput, string> = {
  dm: 'dry matter',
  cp: 'crude protein',
  ee: 'crude fat',
  cf: 'crude fibre',
  ash: 'ash',
  nfe: 'nitrogen-free extract',
  starch: 'starch',
  adf: 'ADF',
  ndf: 'NDF',
  de: 'pig DE',
  me: 'pig ME',
};

/**
 * NFE (%) as fed: DM − CP − EE − CF − ash, when all five are known; null otherwise.
 */
export function nitrogenFreeExtract(c: EnergyComposition): number | null {
  const { dm, cp, ee, cf, ash } = c;
  if (dm == null || cp == null || ee == null || cf == null || ash == null) return null;
  return dm - cp - ee - cf - ash;
}

export type EnergyEstimate =
  | { ok: true; equation: EnergyEquation; asFed: number; dryMatter: number }
  | { ok: false; equation: EnergyEquation; missing: EnergyInput[]; message: string };

/**
 * Applies one equation to a composition given as fed.
 * @param composition % of the feed as fed (energies kcal/kg as fed); `dm` is required (0 < DM <= 100)
 * @returns kcal/kg as fed and per kg DM, or the inputs that are missing
 */
export function applyEnergyEquation(equation: EnergyEquation, composition: EnergyComposition): EnergyEstimate {
  const dm = composition.dm;
  const withNfe: EnergyComposition = { ...composition, nfe: composition.nfe ?? nitrogenFreeExtract(composition) };
  const missing = (['dm', ...equation.inputs] as EnergyInput[]).filter((k, i, all) => all.indexOf(k) === i && withNfe[k] == null);
  if (dm == null || missing.length > 0) {
    const names = missing.map((k) => ENERGY_INPUT_LABELS[k]).join(', ');
    return { ok: false, equation, missing, message: `${equation.name} needs ${names}; map or enter ${missing.length === 1 ? 'it' : 'them'} to estimate ${equation.output === 'amen_poultry' ? 'AMEn' : 'this energy'}.` };
  }
  // Inputs on the equation's basis: per kg DM, or at the equation's fixed dry matter.
  const targetDm = equation.basis === 'fixed_dm' ? (equation.fixedDmPct ?? 100) : 100;
  const x = {} as Record<EnergyInput, number>;
  for (const k of Object.keys(withNfe) as EnergyInput[]) {
    const v = withNfe[k];
    if (v == null) continue;
    x[k] = k === 'dm' ? targetDm : (asFedToDryMatter(v, dm) * targetDm) / 100;
  }
  const onBasis = equation.compute(x);
  const dryMatter = (onBasis * 100) / targetDm;
  return { ok: true, equation, dryMatter, asFed: dryMatterToAsFed(dryMatter, dm) };
}
