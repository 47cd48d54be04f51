/**
 * By-product streams that black soldier fly larvae can be reared on, with the default factors the supply
 * plan uses for each: moisture, yields, the larvae's composition and what feed law says about the substrate.
 * Every default names where it comes from and how far it can be trusted (`confidence`):
 * `verified` was read in the named source, `derived` was computed from verified figures, `from_memory` is a
 * typical value recalled from the named study, still to be confirmed against it. The user can override
 * every factor per stream. Pure data: no framework imports.
 */
import type { Confidence, OriginAnimal, SubstrateOrigin } from '../library-terms';

/** A default figure with its source. */
export type Sourced = { value: number; source: string; confidence: Confidence };

/** The kinds of stream a plan can list. */
export const SUBSTRATE_KINDS = ['food_waste', 'brewery_grains', 'fruit_vegetable_waste', 'fish_offal', 'slaughter_by_products', 'manure'] as const;
export type SubstrateKind = (typeof SUBSTRATE_KINDS)[number];

/** Proximate items estimated for the larvae, each in % of the larvae's dry matter. */
export const LARVAE_NUTRIENTS = ['cp', 'ee', 'ash', 'ca', 'p'] as const;
export type LarvaeNutrient = (typeof LARVAE_NUTRIENTS)[number];
export const LARVAE_NUTRIENT_LABELS: Record<LarvaeNutrient, string> = {
  cp: 'Crude protein',
  ee: 'Crude fat',
  ash: 'Ash',
  ca: 'Calcium',
  p: 'Phosphorus',
};

/** Where feed law is looked up. Only a note: local regulations decide. */
export const JURISDICTIONS = ['EU', 'US'] as const;
export type Jurisdiction = (typeof JURISDICTIONS)[number];

/** What a jurisdiction's rules say about rearing insects for farm-animal feed on a substrate. */
export type RegulatoryNote = {
  jurisdiction: Jurisdiction;
  /** `not_allowed`: the substrate is excluded; `conditions`: allowed only under conditions the note names. */
  status: 'not_allowed' | 'conditions';
  text: string;
  source: string;
};

/** The yield factors of a stream, on a dry-matter basis. */
export type YieldFactors = {
  /** Larval dry matter harvested per substrate dry matter fed, % (bioconversion ratio on DM). */
  bioconversionDmPct: number;
  /** Rearing residue (frass) dry matter per substrate dry matter fed, %. The rest is respired. */
  residueDmPct: number;
  /** Dry matter of the fresh larvae at harvest, %. */
  larvaeDryMatterPct: number;
};

export type SubstrateDefaults = {
  kind: SubstrateKind;
  label: string;
  origin: SubstrateOrigin;
  /** Animals the user may say the substrate came from (empty: plant origin only). */
  animalChoices: readonly OriginAnimal[];
  /** Animals assumed until the user says otherwise. */
  defaultAnimals: readonly OriginAnimal[];
  /** Water in the substrate as delivered, %. */
  moisturePct: Sourced;
  /** Crude protein of the substrate, % of its dry matter (for the protein balance). */
  substrateCpDmPct: Sourced;
  yields: Record<keyof YieldFactors, Sourced>;
  /** The larvae's composition, % of larval dry matter. */
  larvae: Record<LarvaeNutrient, Sourced>;
  regulatory: RegulatoryNote[];
  note?: string;
};

// Sources named once so every default cites them the same way.
const SPRANGHERS = 'Spranghers et al. 2017, J. Sci. Food Agric. 97:2594–2600';
const FEEDIPEDIA_BSF = 'Feedipedia black soldier fly datasheet, as summarised in the reference notes (check the original)';
const BSF_REVIEW = 'Review summary of black soldier fly larvae composition (blacksoldierflies.com nutrient contents)';
const BREWERY_TRIAL = 'Animals 2020, 10:682 (PMC7222827), Table 1: larvae reared on brewers’ by-product';
const LALANDER = 'Lalander et al. 2019, J. Clean. Prod. 208:211–219 (substrates compared in one rearing trial)';
const MENEGUZ = 'Meneguz et al. 2018, J. Sci. Food Agric. 98:5776–5784 (brewery, fruit and vegetable substrates)';
const EU_FEED_BAN = 'Reg. (EC) 1069/2009 and Reg. (EU) 2017/893 (insects are farmed animals; closed list of animal products allowed as substrate)';
const US_AAFCO = 'AAFCO definition T60.117(C) Dried Black Soldier Fly Larvae: feedstock exclusively of feed-grade materials';

const memory = (value: number, source: string): Sourced => ({ value, source: `${source} — from memory, to be confirmed`, confidence: 'from_memory' });
const verified = (value: number, source: string): Sourced => ({ value, source, confidence: 'verified' });
const derived = (value: number, source: string): Sourced => ({ value, source, confidence: 'derived' });

/** General black soldier fly composition, used where no trial on the substrate gave a figure (range midpoints). */
const GENERAL = {
  cp: derived(42, `${FEEDIPEDIA_BSF}: CP about 40–44 % DM, midpoint`),
  ash: derived(19.5, `${FEEDIPEDIA_BSF}: ash 11–28 % DM, midpoint`),
  ca: derived(6.5, `${FEEDIPEDIA_BSF}: Ca 5–8 % DM, midpoint`),
  p: derived(1.05, `${FEEDIPEDIA_BSF}: P 0.6–1.5 % DM, midpoint`),
  larvaeDm: derived(32, `${BSF_REVIEW}: fresh larvae 20–44 % DM, midpoint`),
  cpSpranghers: derived(41.5, `${SPRANGHERS}: CP 399–431 g/kg DM over four substrates, midpoint`),
};

const EU_ANIMAL_ORIGIN: RegulatoryNote = {
  jurisdiction: 'EU',
  status: 'not_allowed',
  text: 'Animal by-products outside the closed list (fishmeal, non-ruminant blood products, rendered fats, milk, eggs…) may not be fed to insects reared for feed.',
  source: EU_FEED_BAN,
};
const US_NOT_FEED_GRADE: RegulatoryNote = {
  jurisdiction: 'US',
  status: 'not_allowed',
  text: 'Larvae for poultry and pig feed must be reared on feed-grade materials only; this substrate is not one.',
  source: US_AAFCO,
};

const POULTRY_PIG_CATTLE: readonly OriginAnimal[] = ['chicken', 'turkey', 'duck', 'pig', 'cattle', 'sheep_goat'];

/** The default factors for every kind of stream. */
export const SUBSTRATES: Record<SubstrateKind, SubstrateDefaults> = {
  food_waste: {
    kind: 'food_waste',
    label: 'Food waste (catering and kitchen)',
    origin: 'mixed',
    animalChoices: [...POULTRY_PIG_CATTLE, 'fish'],
    defaultAnimals: [],
    moisturePct: { value: 80, source: 'Food waste is about 80 % water (common practice)', confidence: 'from_memory' },
    substrateCpDmPct: memory(18, 'Typical food waste protein 15–20 % DM'),
    yields: {
      // The trade's rule of thumb (about 20 kg of fresh larvae from 100 kg of food waste at 80 % water) at 32 % larval DM.
      bioconversionDmPct: { value: 32, source: `Common practice: about 20 kg of fresh larvae from 100 kg of food waste; ${LALANDER} report about 23 % of DM (from memory)`, confidence: 'from_memory' },
      residueDmPct: memory(25, `${LALANDER}: food waste dry matter reduced by about 75 %`),
      larvaeDryMatterPct: GENERAL.larvaeDm,
    },
    larvae: {
      cp: GENERAL.cpSpranghers,
      ee: derived(45.5, `${FEEDIPEDIA_BSF}: fat 42–49 % DM on oil-rich food waste, midpoint`),
      ash: derived(2.7, `${SPRANGHERS}: prepupae on restaurant waste, ash 27 g/kg DM`),
      ca: memory(0.9, 'No figure found for food-waste larvae: the general Ca-to-ash ratio (6.5 : 19.5) applied to 2.7 % ash'),
      p: memory(0.6, `No figure found for food-waste larvae: the low end of the general 0.6–1.5 % DM range (${FEEDIPEDIA_BSF})`),
    },
    regulatory: [
      { jurisdiction: 'EU', status: 'not_allowed', text: 'Catering and kitchen waste may not be fed to farmed animals, insects included.', source: 'Reg. (EC) 1069/2009' },
      US_NOT_FEED_GRADE,
    ],
    note: 'Larvae on food waste are fat and low in ash, so calcium and phosphorus are estimates: analyse the meal. If the waste holds meat or fish, say which animals.',
  },
  brewery_grains: {
    kind: 'brewery_grains',
    label: 'Brewery spent grains',
    origin: 'plant',
    animalChoices: [],
    defaultAnimals: [],
    moisturePct: memory(78, 'Wet brewers’ spent grains 75–80 % water (Mussatto et al. 2006, J. Cereal Sci. 43:1–14)'),
    substrateCpDmPct: memory(23, 'Brewers’ spent grains protein 15–30 % DM (Mussatto et al. 2006)'),
    yields: {
      bioconversionDmPct: memory(15, `${MENEGUZ}: brewery by-product`),
      residueDmPct: memory(55, `${MENEGUZ}: brewery by-product, fibrous, less reduced`),
      larvaeDryMatterPct: verified(34.1, `${BREWERY_TRIAL}: fresh larvae 34.1 % DM`),
    },
    larvae: {
      cp: verified(49.1, `${BREWERY_TRIAL} (N × 4.73)`),
      ee: verified(36.6, BREWERY_TRIAL),
      ash: verified(5.45, BREWERY_TRIAL),
      ca: derived(1.85, `${BREWERY_TRIAL}: 18.5 g/kg DM`),
      p: derived(0.44, `${BREWERY_TRIAL}: 4.40 g/kg DM`),
    },
    regulatory: [{ jurisdiction: 'US', status: 'conditions', text: 'Allowed when the grains are a feed-grade material.', source: US_AAFCO }],
  },
  fruit_vegetable_waste: {
    kind: 'fruit_vegetable_waste',
    label: 'Fruit and vegetable waste',
    origin: 'plant',
    animalChoices: [],
    defaultAnimals: [],
    moisturePct: memory(88, 'Fruit and vegetable waste 85–90 % water (common practice)'),
    substrateCpDmPct: memory(13, 'Fruit and vegetable waste protein 10–15 % DM (common practice)'),
    yields: {
      bioconversionDmPct: memory(12, `${MENEGUZ}: fruit and vegetable mix`),
      residueDmPct: memory(35, `${MENEGUZ}: fruit and vegetable mix`),
      larvaeDryMatterPct: GENERAL.larvaeDm,
    },
    larvae: {
      cp: GENERAL.cpSpranghers,
      ee: derived(37.1, `${SPRANGHERS}: prepupae on vegetable waste, EE 371 g/kg DM`),
      ash: derived(9.6, `${SPRANGHERS}: prepupae on vegetable waste, ash 96 g/kg DM`),
      ca: GENERAL.ca,
      p: GENERAL.p,
    },
    regulatory: [
      { jurisdiction: 'EU', status: 'conditions', text: 'Allowed when it holds no meat or fish (former foodstuffs of plant origin).', source: EU_FEED_BAN },
      { jurisdiction: 'US', status: 'conditions', text: 'Allowed only when it is a feed-grade material.', source: US_AAFCO },
    ],
  },
  fish_offal: {
    kind: 'fish_offal',
    label: 'Fish offal',
    origin: 'animal',
    animalChoices: ['fish'],
    defaultAnimals: ['fish'],
    moisturePct: memory(75, 'Raw fish offal about 70–80 % water'),
    substrateCpDmPct: memory(50, 'Fish offal protein 40–60 % DM'),
    yields: {
      bioconversionDmPct: memory(20, 'St-Hilaire et al. 2007, J. World Aquacult. Soc. 38:309–313 (fish offal added to manure)'),
      residueDmPct: memory(30, 'St-Hilaire et al. 2007'),
      larvaeDryMatterPct: GENERAL.larvaeDm,
    },
    larvae: {
      cp: GENERAL.cp,
      ee: derived(30, `${FEEDIPEDIA_BSF}: lipid 30 % DM with 50 % fish offal and 50 % manure`),
      ash: GENERAL.ash,
      ca: GENERAL.ca,
      p: GENERAL.p,
    },
    regulatory: [EU_ANIMAL_ORIGIN, US_NOT_FEED_GRADE],
  },
  slaughter_by_products: {
    kind: 'slaughter_by_products',
    label: 'Slaughter by-products',
    origin: 'animal',
    animalChoices: POULTRY_PIG_CATTLE,
    defaultAnimals: ['chicken'],
    moisturePct: memory(70, 'Raw slaughter by-products about 65–75 % water'),
    substrateCpDmPct: memory(45, 'Slaughter by-products protein 40–50 % DM'),
    yields: {
      bioconversionDmPct: memory(21, `${LALANDER}: abattoir waste`),
      residueDmPct: memory(30, `${LALANDER}: abattoir waste`),
      larvaeDryMatterPct: GENERAL.larvaeDm,
    },
    larvae: {
      cp: GENERAL.cp,
      ee: derived(23, `${BSF_REVIEW}: fat 7–39 % DM, midpoint`),
      ash: GENERAL.ash,
      ca: GENERAL.ca,
      p: GENERAL.p,
    },
    regulatory: [EU_ANIMAL_ORIGIN, US_NOT_FEED_GRADE],
  },
  manure: {
    kind: 'manure',
    label: 'Manure',
    origin: 'animal',
    animalChoices: POULTRY_PIG_CATTLE,
    defaultAnimals: ['chicken'],
    moisturePct: memory(75, 'Fresh poultry or pig manure 70–85 % water'),
    substrateCpDmPct: memory(25, 'Manure crude protein 15–30 % DM'),
    yields: {
      bioconversionDmPct: memory(8, `${LALANDER}: manures gave the lowest conversion`),
      residueDmPct: memory(60, `${LALANDER}: manures`),
      larvaeDryMatterPct: GENERAL.larvaeDm,
    },
    larvae: {
      cp: GENERAL.cp,
      ee: derived(20, `${FEEDIPEDIA_BSF}: fat 15–25 % DM on poultry manure (28 % pig, 35 % cattle), midpoint`),
      ash: GENERAL.ash,
      ca: GENERAL.ca,
      p: GENERAL.p,
    },
    regulatory: [
      { jurisdiction: 'EU', status: 'not_allowed', text: 'Manure (a category 2 material) may not be fed to insects reared for feed.', source: EU_FEED_BAN },
      US_NOT_FEED_GRADE,
    ],
  },
};

/** Dried meal dry matter, %: dried to at most 10 % moisture (AAFCO T60.117(C)); 92 % is common practice. */
export const DEFAULT_MEAL_DRY_MATTER_PCT: Sourced = { value: 92, source: 'Meal dried to at most 10 % moisture (AAFCO T60.117(C)); 92 % DM is common practice', confidence: 'derived' };

/** Water left in the rearing residue when it is taken off, %. */
export const DEFAULT_RESIDUE_MOISTURE_PCT: Sourced = { value: 30, source: 'Frass taken off at 20–40 % water (common practice) — from memory, to be confirmed', confidence: 'from_memory' };

/** Fat left in a pressed (partially defatted) meal, % as fed. */
export const DEFAULT_RESIDUAL_FAT_PCT: Sourced = {
  value: 14.4,
  source: 'Partially defatted larvae meal, 14.4 % fat as fed (ASAS abstract 228, SID of partially defatted larvae meal in growing pigs)',
  confidence: 'verified',
};

/** Soybean grain yield, t/ha per year. */
export const DEFAULT_SOYBEAN_YIELD_T_PER_HA: Sourced = memory(2.8, 'World average soybean yield about 2.8 t/ha (FAOSTAT, 2020–2022)');

/** Crude protein of soybean grain, % as fed. */
export const DEFAULT_SOYBEAN_CP_PCT: Sourced = memory(37, 'Full-fat soybean 36–38 % CP as fed, midpoint (reference notes §2.1)');

/** The default factors a stream starts from. */
export function defaultYields(kind: SubstrateKind): YieldFactors {
  const y = SUBSTRATES[kind].yields;
  return { bioconversionDmPct: y.bioconversionDmPct.value, residueDmPct: y.residueDmPct.value, larvaeDryMatterPct: y.larvaeDryMatterPct.value };
}
