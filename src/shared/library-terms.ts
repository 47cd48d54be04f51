/**
 * The fixed vocabularies of the nutrient library and the requirement specifications, shared by the
 * database schema, the zod contracts, the API and the screens. Pure data: no framework imports.
 */

/** Units a nutrient value may carry. Values are always per kg of feed as fed unless a view converts them. */
export const NUTRIENT_UNITS = ['%', 'g/kg', 'mg/kg', 'kcal/kg', 'MJ/kg', 'IU/kg'] as const;
export type NutrientUnit = (typeof NUTRIENT_UNITS)[number];

/** How the catalogue groups nutrients on screen. */
export const NUTRIENT_GROUPS = ['proximate', 'energy', 'amino_acids', 'minerals', 'fat_and_fibre', 'insect'] as const;
export type NutrientGroup = (typeof NUTRIENT_GROUPS)[number];
export const NUTRIENT_GROUP_LABELS: Record<NutrientGroup, string> = {
  proximate: 'Dry matter and proximate analysis',
  energy: 'Energy',
  amino_acids: 'Protein and amino acids',
  minerals: 'Minerals',
  fat_and_fibre: 'Fat and fibre',
  insect: 'Insect meal',
};

/**
 * The basis an amino acid value is given on. Each basis is a separate nutrient, so a total value can
 * never meet a digestible bound: `digestible` is the poultry standardized/true digestible basis, `sid`
 * the swine standardized ileal digestible basis.
 */
export const AMINO_ACID_BASES = ['total', 'digestible', 'sid'] as const;
export type AminoAcidBasis = (typeof AMINO_ACID_BASES)[number];

/** Animal families a diet is made for. A nutrient lists the families that use it. */
export const SPECIES_FAMILIES = ['poultry', 'swine'] as const;
export type SpeciesFamily = (typeof SPECIES_FAMILIES)[number];
export const SPECIES_FAMILY_LABELS: Record<SpeciesFamily, string> = { poultry: 'Poultry', swine: 'Pigs' };

export const INGREDIENT_CATEGORIES = [
  'cereal_grain',
  'cereal_by_product',
  'oilseed_meal',
  'animal_protein',
  'insect_meal',
  'fat_and_oil',
  'mineral',
  'synthetic_amino_acid',
  'premix',
] as const;
export type IngredientCategory = (typeof INGREDIENT_CATEGORIES)[number];
export const INGREDIENT_CATEGORY_LABELS: Record<IngredientCategory, string> = {
  cereal_grain: 'Cereal grain',
  cereal_by_product: 'Cereal by-product',
  oilseed_meal: 'Oilseed meal',
  animal_protein: 'Animal protein',
  insect_meal: 'Insect meal',
  fat_and_oil: 'Fat and oil',
  mineral: 'Mineral',
  synthetic_amino_acid: 'Synthetic amino acid',
  premix: 'Premix',
};

/** Insects reared for feed. */
export const INSECT_SPECIES = ['hermetia_illucens', 'tenebrio_molitor', 'musca_domestica'] as const;
export type InsectSpecies = (typeof INSECT_SPECIES)[number];
export const INSECT_SPECIES_LABELS: Record<InsectSpecies, string> = {
  hermetia_illucens: 'Black soldier fly larvae (Hermetia illucens)',
  tenebrio_molitor: 'Yellow mealworm (Tenebrio molitor)',
  musca_domestica: 'Housefly larvae (Musca domestica)',
};

export const INSECT_PROCESSING = ['full_fat', 'partially_defatted', 'defatted'] as const;
export type InsectProcessing = (typeof INSECT_PROCESSING)[number];
export const INSECT_PROCESSING_LABELS: Record<InsectProcessing, string> = {
  full_fat: 'Full-fat',
  partially_defatted: 'Partially defatted',
  defatted: 'Defatted',
};

/**
 * Where a rearing substrate came from. `animal` and `mixed` must name the animals; `unknown` is shown
 * with a caution until the supplier says what the larvae ate.
 */
export const SUBSTRATE_ORIGINS = ['plant', 'animal', 'mixed', 'unknown'] as const;
export type SubstrateOrigin = (typeof SUBSTRATE_ORIGINS)[number];

/**
 * Animals a substrate of animal origin may come from, with the diet family they belong to (null when
 * no diet in Troughline is made for them). The family is what the insect-protein rule compares.
 */
export const ORIGIN_ANIMALS = {
  chicken: { label: 'Chicken', family: 'poultry' },
  turkey: { label: 'Turkey', family: 'poultry' },
  duck: { label: 'Duck', family: 'poultry' },
  pig: { label: 'Pig', family: 'swine' },
  cattle: { label: 'Cattle', family: null },
  sheep_goat: { label: 'Sheep or goat', family: null },
  fish: { label: 'Fish', family: null },
} as const satisfies Record<string, { label: string; family: SpeciesFamily | null }>;
export type OriginAnimal = keyof typeof ORIGIN_ANIMALS;
export const ORIGIN_ANIMAL_CODES = Object.keys(ORIGIN_ANIMALS) as [OriginAnimal, ...OriginAnimal[]];

/** Where a set of nutrient values came from. */
export const VALUE_SOURCE_KINDS = ['table', 'lab', 'estimate'] as const;
export type ValueSourceKind = (typeof VALUE_SOURCE_KINDS)[number];
export const VALUE_SOURCE_KIND_LABELS: Record<ValueSourceKind, string> = {
  table: 'Published table',
  lab: 'Lab analysis',
  estimate: 'Own estimate',
};

/**
 * How far a value can be trusted: `verified` was read in the named source; `derived` was computed from
 * verified inputs or chemistry; `from_memory` is a typical value still to be confirmed against the source.
 */
export const CONFIDENCE_LEVELS = ['verified', 'derived', 'from_memory'] as const;
export type Confidence = (typeof CONFIDENCE_LEVELS)[number];
export const CONFIDENCE_LABELS: Record<Confidence, string> = {
  verified: 'Checked against the source',
  derived: 'Calculated (exact)',
  from_memory: 'Typical value, to be confirmed',
};

/** What an inclusion cap applies to: one ingredient, every ingredient of a category, or every meal of one insect. */
export const CAP_SCOPES = ['ingredient', 'category', 'insect_species'] as const;
export type CapScope = (typeof CAP_SCOPES)[number];

/** Which library a row belongs to. The reference library is read-only and shared by everyone. */
export const LIBRARIES = ['own', 'reference'] as const;
export type LibraryName = (typeof LIBRARIES)[number];

/** Page size limits for every library list. */
export const PAGE_SIZE = { default: 25, max: 200 } as const;
