/**
 * The reference ingredient library. Every value set names its source and how far it can be trusted:
 * `verified` was read in the named publication, `derived` is exact arithmetic (chemistry of the pure
 * compound, or a published dry-matter value put on an as-fed basis), `from_memory` is a typical value
 * recalled from the named table and still to be confirmed against the printed page.
 */
import type {
  Confidence,
  IngredientCategory,
  InsectProcessing,
  InsectSpecies,
  OriginAnimal,
  SubstrateOrigin,
  ValueSourceKind,
} from '../../../src/shared/library-terms';

export type ReferenceValueSet = {
  sourceKind: ValueSourceKind;
  sourceName: string;
  confidence: Confidence;
  /** The dry matter the as-fed values refer to, %. */
  dryMatterPct: number;
  /** `dry_matter`: the values below are per kg DM as published and are stored as fed at `dryMatterPct`. */
  publishedBasis?: 'as_fed' | 'dry_matter';
  note?: string;
  values: Record<string, number>;
};

export type ReferenceIngredient = {
  code: string;
  name: string;
  category: IngredientCategory;
  notes?: string;
  insect?: { species: InsectSpecies; processing: InsectProcessing; substrate: string; origin: SubstrateOrigin; animals?: OriginAnimal[] };
  valueSets: ReferenceValueSet[];
};

const NRC_2012_MEMORY = 'Typical as-fed value, from memory of NRC (2012) Nutrient Requirements of Swine, Table 17-1 (to confirm)';
const NRC_1994_MEMORY = 'Typical as-fed value, from memory of NRC (1994) Nutrient Requirements of Poultry, Table 9-1 (to confirm)';
const STOICHIOMETRY = 'Stoichiometry of the pure compound (exact; feed grades differ: use the supplier’s guarantee)';

/** Total amino acids and the digestible fractions used to give poultry digestible and swine SID values. */
function aminoAcids(total: Record<string, number>, poultryDigestibility: number, swineSid: number): Record<string, number> {
  const out: Record<string, number> = {};
  for (const [code, value] of Object.entries(total)) {
    out[code] = value;
    out[`dig_${code}`] = round(value * poultryDigestibility, 3);
    out[`sid_${code}`] = round(value * swineSid, 3);
  }
  return out;
}

function round(value: number, places: number): number {
  const f = 10 ** places;
  return Math.round(value * f) / f;
}

/** A conventional feed with typical values from memory of the composition tables: one value set. */
function typical(code: string, name: string, category: IngredientCategory, dm: number, values: Record<string, number>, note?: string): ReferenceIngredient {
  return {
    code,
    name,
    category,
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: `${NRC_2012_MEMORY}; poultry values from memory of ${NRC_1994_MEMORY.replace('Typical as-fed value, from memory of ', '')}`,
        confidence: 'from_memory',
        dryMatterPct: dm,
        note: note ?? 'Digestible and SID amino acids are total × a typical digestibility for this feed (from memory).',
        values: { dm, ...values },
      },
    ],
  };
}

export const REFERENCE_INGREDIENTS: ReferenceIngredient[] = [
  typical('maize', 'Maize (yellow corn)', 'cereal_grain', 89, {
    cp: 8.5, ee: 3.8, cf: 2.2, ash: 1.3, starch: 62, ca: 0.02, p: 0.28, avp: 0.08, sttd_p: 0.09, na: 0.02, cl: 0.05, k: 0.33, linoleic: 1.9,
    amen_poultry: 3350, me_swine: 3395, ne_swine: 2672,
    ...aminoAcids({ lys: 0.25, met: 0.18, metcys: 0.37, thr: 0.28, trp: 0.06, arg: 0.38, ile: 0.27, val: 0.38, leu: 0.96 }, 0.88, 0.82),
  }),
  typical('wheat', 'Wheat', 'cereal_grain', 88, {
    cp: 13, ee: 1.7, cf: 2.5, ash: 1.7, starch: 57, ca: 0.05, p: 0.35, avp: 0.13, sttd_p: 0.17, na: 0.01, cl: 0.06, k: 0.4, linoleic: 0.6,
    amen_poultry: 3100, me_swine: 3300, ne_swine: 2400,
    ...aminoAcids({ lys: 0.36, met: 0.2, metcys: 0.48, thr: 0.37, trp: 0.15, arg: 0.6, ile: 0.44, val: 0.56, leu: 0.86 }, 0.88, 0.86),
  }),
  typical('barley', 'Barley', 'cereal_grain', 89, {
    cp: 11, ee: 1.8, cf: 5, ash: 2.4, starch: 50, ca: 0.05, p: 0.35, avp: 0.15, sttd_p: 0.14, na: 0.02, cl: 0.12, k: 0.45, linoleic: 0.8,
    amen_poultry: 2640, me_swine: 3000, ne_swine: 2200,
    ...aminoAcids({ lys: 0.39, met: 0.18, metcys: 0.42, thr: 0.36, trp: 0.13, arg: 0.53, ile: 0.38, val: 0.53, leu: 0.75 }, 0.8, 0.78),
  }),
  typical('sorghum', 'Sorghum, low tannin', 'cereal_grain', 88, {
    cp: 9.5, ee: 2.9, cf: 2.3, ash: 1.5, starch: 63, ca: 0.03, p: 0.29, avp: 0.08, na: 0.01, k: 0.35, linoleic: 1.1,
    amen_poultry: 3250, me_swine: 3300, ne_swine: 2500,
    ...aminoAcids({ lys: 0.22, met: 0.16, metcys: 0.33, thr: 0.31, trp: 0.09, arg: 0.38, ile: 0.37, val: 0.46, leu: 1.21 }, 0.85, 0.8),
  }),
  typical('soybean-meal-44', 'Soybean meal, 44 % CP (with hulls)', 'oilseed_meal', 89, {
    cp: 44, ee: 1, cf: 7, ash: 6.5, ca: 0.3, p: 0.65, avp: 0.25, sttd_p: 0.3, na: 0.02, cl: 0.05, k: 2.0, linoleic: 0.4,
    amen_poultry: 2230, me_swine: 3100, ne_swine: 1950,
    ...aminoAcids({ lys: 2.83, met: 0.61, metcys: 1.31, thr: 1.73, trp: 0.61, arg: 3.23, ile: 1.99, val: 2.09, leu: 3.42 }, 0.9, 0.88),
  }),
  typical('soybean-meal-48', 'Soybean meal, 48 % CP (dehulled)', 'oilseed_meal', 90, {
    cp: 48, ee: 1, cf: 3.5, ash: 6, ca: 0.3, p: 0.65, avp: 0.25, sttd_p: 0.31, na: 0.02, cl: 0.05, k: 2.1, linoleic: 0.4,
    amen_poultry: 2440, me_swine: 3300, ne_swine: 2100,
    ...aminoAcids({ lys: 2.96, met: 0.66, metcys: 1.36, thr: 1.86, trp: 0.66, arg: 3.45, ile: 2.14, val: 2.23, leu: 3.66 }, 0.9, 0.89),
  }),
  typical('full-fat-soybean', 'Full-fat soybean, heat-treated', 'oilseed_meal', 90, {
    cp: 37, ee: 19, cf: 5, ash: 4.8, ca: 0.25, p: 0.58, avp: 0.2, sttd_p: 0.26, na: 0.03, k: 1.6, linoleic: 10,
    amen_poultry: 3300, me_swine: 3700, ne_swine: 2700,
    ...aminoAcids({ lys: 2.22, met: 0.53, metcys: 1.08, thr: 1.42, trp: 0.48, arg: 2.6, ile: 1.6, val: 1.7, leu: 2.75 }, 0.86, 0.84),
  }),
  typical('canola-meal', 'Canola meal, solvent extracted', 'oilseed_meal', 90, {
    cp: 37, ee: 3.5, cf: 11.5, ash: 7, ca: 0.65, p: 1.1, avp: 0.3, sttd_p: 0.38, na: 0.05, k: 1.2, linoleic: 0.6,
    amen_poultry: 2000, me_swine: 2600, ne_swine: 1600,
    ...aminoAcids({ lys: 2.08, met: 0.74, metcys: 1.63, thr: 1.6, trp: 0.45, arg: 2.21, ile: 1.43, val: 1.87, leu: 2.58 }, 0.8, 0.76),
  }),
  typical('corn-ddgs', 'Corn distillers dried grains with solubles (DDGS)', 'cereal_by_product', 89, {
    cp: 27, ee: 9.5, cf: 7, ash: 4.5, ca: 0.05, p: 0.75, avp: 0.5, sttd_p: 0.55, na: 0.2, k: 0.9, linoleic: 5,
    amen_poultry: 2800, me_swine: 3100, ne_swine: 2200,
    ...aminoAcids({ lys: 0.78, met: 0.55, metcys: 1.08, thr: 1.02, trp: 0.21, arg: 1.17, ile: 1.01, val: 1.35, leu: 3.17 }, 0.75, 0.68),
  }, 'Fat and fibre vary widely between plants: analyse each supply. Digestible amino acids are total × a typical digestibility (from memory).'),
  typical('wheat-bran', 'Wheat bran', 'cereal_by_product', 89, {
    cp: 15.5, ee: 4, cf: 10, ash: 6, starch: 22, ca: 0.13, p: 1.1, avp: 0.3, sttd_p: 0.5, na: 0.05, k: 1.2, linoleic: 1.8,
    amen_poultry: 1550, me_swine: 2400, ne_swine: 1600,
    ...aminoAcids({ lys: 0.61, met: 0.23, metcys: 0.55, thr: 0.5, trp: 0.22, arg: 1.0, ile: 0.48, val: 0.7, leu: 0.95 }, 0.72, 0.7),
  }),
  typical('fish-meal-65', 'Fish meal, 65 % CP', 'animal_protein', 92, {
    cp: 65, ee: 9, cf: 1, ash: 17.5, ca: 4.75, p: 3.0, avp: 2.8, sttd_p: 2.4, na: 0.5, cl: 0.6, k: 0.8,
    amen_poultry: 2900, me_swine: 3300, ne_swine: 2200,
    ...aminoAcids({ lys: 4.8, met: 1.75, metcys: 2.35, thr: 2.6, trp: 0.7, arg: 3.8, ile: 2.7, val: 3.1, leu: 4.6 }, 0.88, 0.88),
  }),
  typical('meat-bone-meal', 'Meat and bone meal', 'animal_protein', 93, {
    cp: 50, ee: 9.5, cf: 2.5, ash: 30, ca: 9.5, p: 4.75, avp: 4.0, sttd_p: 3.7, na: 0.7, k: 0.6,
    amen_poultry: 2300, me_swine: 2400, ne_swine: 1600,
    ...aminoAcids({ lys: 2.6, met: 0.7, metcys: 1.2, thr: 1.6, trp: 0.3, arg: 3.5, ile: 1.4, val: 2.2, leu: 3.1 }, 0.8, 0.77),
  }, 'Variable calcium and phosphorus; check local law on processed animal proteins before use. Digestible amino acids are total × a typical digestibility (from memory).'),
  typical('soybean-oil', 'Soybean oil', 'fat_and_oil', 99, { ee: 99, linoleic: 52, amen_poultry: 8950, me_swine: 8300, ne_swine: 7100 }, 'Energy values differ between tables; confirm against your chosen table.'),
  typical('animal-fat', 'Animal fat (tallow)', 'fat_and_oil', 99, { ee: 99, linoleic: 3.5, amen_poultry: 7900, me_swine: 8000, ne_swine: 7000 }, 'Energy values differ between tables; confirm against your chosen table.'),
  {
    code: 'limestone',
    name: 'Limestone (calcium carbonate)',
    category: 'mineral',
    notes: 'Feed-grade limestone is usually 36–38.5 % Ca (typical, from memory): enter your supplier’s guarantee.',
    valueSets: [
      { sourceKind: 'table', sourceName: `${STOICHIOMETRY}: CaCO₃, Ca 40.078 / 100.087`, confidence: 'derived', dryMatterPct: 99, values: { ca: 40.04 } },
      { sourceKind: 'table', sourceName: 'Typical value for feed-grade limestone, from memory (to confirm)', confidence: 'from_memory', dryMatterPct: 99, values: { dm: 99, ash: 95 } },
    ],
  },
  {
    code: 'dicalcium-phosphate',
    name: 'Dicalcium phosphate, dihydrate (CaHPO₄·2H₂O)',
    category: 'mineral',
    notes: 'Feed grades are about 22 % Ca and 18.5 % P (typical, from memory): enter your supplier’s guarantee.',
    valueSets: [
      { sourceKind: 'table', sourceName: `${STOICHIOMETRY}: CaHPO₄·2H₂O, molar mass 172.09`, confidence: 'derived', dryMatterPct: 100, values: { ca: 23.29, p: 18.0 } },
      { sourceKind: 'table', sourceName: 'Availability of phosphorus, typical (from memory; to confirm)', confidence: 'from_memory', dryMatterPct: 100, values: { avp: 18.0, sttd_p: 14.6 } },
    ],
  },
  {
    code: 'monocalcium-phosphate',
    name: 'Monocalcium phosphate, monohydrate (Ca(H₂PO₄)₂·H₂O)',
    category: 'mineral',
    notes: 'Feed grades are about 16–17 % Ca and 21–22.7 % P (typical, from memory): enter your supplier’s guarantee.',
    valueSets: [
      { sourceKind: 'table', sourceName: `${STOICHIOMETRY}: Ca(H₂PO₄)₂·H₂O, molar mass 252.07`, confidence: 'derived', dryMatterPct: 100, values: { ca: 15.9, p: 24.58 } },
      { sourceKind: 'table', sourceName: 'Availability of phosphorus, typical (from memory; to confirm)', confidence: 'from_memory', dryMatterPct: 100, values: { avp: 24.58, sttd_p: 21.6 } },
    ],
  },
  {
    code: 'salt',
    name: 'Salt (sodium chloride)',
    category: 'mineral',
    valueSets: [
      { sourceKind: 'table', sourceName: `${STOICHIOMETRY}: NaCl, Na 22.990 / 58.443`, confidence: 'derived', dryMatterPct: 99.5, values: { na: 39.34, cl: 60.66 } },
      { sourceKind: 'table', sourceName: 'Typical value, from memory (to confirm)', confidence: 'from_memory', dryMatterPct: 99.5, values: { dm: 99.5, ash: 99 } },
    ],
  },
  {
    code: 'sodium-bicarbonate',
    name: 'Sodium bicarbonate (NaHCO₃)',
    category: 'mineral',
    valueSets: [
      { sourceKind: 'table', sourceName: `${STOICHIOMETRY}: NaHCO₃, molar mass 84.007`, confidence: 'derived', dryMatterPct: 99, values: { na: 27.37 } },
      { sourceKind: 'table', sourceName: 'Typical value, from memory (to confirm)', confidence: 'from_memory', dryMatterPct: 99, values: { dm: 99 } },
    ],
  },
  {
    code: 'l-lysine-hcl',
    name: 'L-Lysine monohydrochloride',
    category: 'synthetic_amino_acid',
    notes: 'A product at 98.5 % purity carries about 78.8 % lysine. Formulate on the lysine content, not the product mass.',
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: `${STOICHIOMETRY}: C₆H₁₄N₂O₂·HCl, molar mass 182.65; N 15.34 % → CP (N × 6.25) 95.9 %`,
        confidence: 'derived',
        dryMatterPct: 99,
        note: 'A free amino acid is fully digestible: digestible and SID equal the total.',
        values: { cp: 95.9, lys: 80.04, dig_lys: 80.04, sid_lys: 80.04 },
      },
      { sourceKind: 'table', sourceName: 'Typical values, from memory (to confirm)', confidence: 'from_memory', dryMatterPct: 99, values: { dm: 99, amen_poultry: 4100 } },
    ],
  },
  {
    code: 'dl-methionine',
    name: 'DL-Methionine',
    category: 'synthetic_amino_acid',
    notes: 'Feed grades are about 99 % methionine (typical, from memory): enter your supplier’s guarantee.',
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: `${STOICHIOMETRY}: C₅H₁₁NO₂S, molar mass 149.21; N 9.39 % → CP 58.7 %`,
        confidence: 'derived',
        dryMatterPct: 99,
        note: 'Values of the pure compound. A free amino acid is fully digestible.',
        values: { cp: 58.7, met: 100, metcys: 100, dig_met: 100, dig_metcys: 100, sid_met: 100, sid_metcys: 100 },
      },
      { sourceKind: 'table', sourceName: 'Typical values, from memory (to confirm)', confidence: 'from_memory', dryMatterPct: 99, values: { dm: 99, amen_poultry: 5000 } },
    ],
  },
  {
    code: 'l-threonine',
    name: 'L-Threonine',
    category: 'synthetic_amino_acid',
    notes: 'Feed grades are about 98–98.5 % threonine (typical, from memory): enter your supplier’s guarantee.',
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: `${STOICHIOMETRY}: C₄H₉NO₃, molar mass 119.12; N 11.76 % → CP 73.5 %`,
        confidence: 'derived',
        dryMatterPct: 99,
        note: 'Values of the pure compound. A free amino acid is fully digestible.',
        values: { cp: 73.5, thr: 100, dig_thr: 100, sid_thr: 100 },
      },
      { sourceKind: 'table', sourceName: 'Typical values, from memory (to confirm)', confidence: 'from_memory', dryMatterPct: 99, values: { dm: 99, amen_poultry: 3600 } },
    ],
  },
  {
    code: 'l-tryptophan',
    name: 'L-Tryptophan',
    category: 'synthetic_amino_acid',
    notes: 'Feed grades are about 98 % tryptophan (typical, from memory): enter your supplier’s guarantee.',
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: `${STOICHIOMETRY}: C₁₁H₁₂N₂O₂, molar mass 204.23; N 13.72 % → CP 85.7 %`,
        confidence: 'derived',
        dryMatterPct: 99,
        note: 'Values of the pure compound. A free amino acid is fully digestible.',
        values: { cp: 85.7, trp: 100, dig_trp: 100, sid_trp: 100 },
      },
      { sourceKind: 'table', sourceName: 'Typical values, from memory (to confirm)', confidence: 'from_memory', dryMatterPct: 99, values: { dm: 99, amen_poultry: 5700 } },
    ],
  },
  {
    code: 'vitamin-mineral-premix',
    name: 'Vitamin and trace-mineral premix',
    category: 'premix',
    notes: 'Enter the guarantee of the premix you buy; usually included at a fixed rate.',
    valueSets: [],
  },

  // Insect meals. Their composition follows the rearing substrate and the processing: analyse each supply.
  {
    code: 'bsf-full-fat-brewery',
    name: 'Black soldier fly larvae meal, full-fat (brewery spent grains)',
    category: 'insect_meal',
    notes: 'Lauric acid (C12:0) is 17.4–44.9 % of the fatty acids depending on the substrate’s fat (Animals 2022, 12(4):486). Crude protein here is N × 4.73.',
    insect: { species: 'hermetia_illucens', processing: 'full_fat', substrate: 'Brewery spent grains', origin: 'plant' },
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: 'Animals 2020, 10:682 (PMC7222827), Table 1: larvae reared on brewers’ by-product, dry-matter basis',
        confidence: 'derived',
        dryMatterPct: 92,
        publishedBasis: 'dry_matter',
        note: 'Published per kg DM; shown as fed at 92 % DM, a meal dried to at most 10 % moisture (common practice). Fresh larvae were 34.1 % DM.',
        values: { cp: 49.1, ee: 36.6, ash: 5.45, ca: 1.85, p: 0.44 },
      },
      {
        sourceKind: 'table',
        sourceName: 'Chitin 5–10 % DM in insect larvae, midpoint (from memory; to confirm)',
        confidence: 'from_memory',
        dryMatterPct: 92,
        publishedBasis: 'dry_matter',
        values: { dm: 100, chitin: 7.5 },
      },
    ],
  },
  {
    code: 'bsf-prepupae-vegetable',
    name: 'Black soldier fly prepupae meal, full-fat (vegetable waste)',
    category: 'insect_meal',
    notes: 'Prepupae on four substrates all had high lauric acid (C12:0).',
    insect: { species: 'hermetia_illucens', processing: 'full_fat', substrate: 'Vegetable waste', origin: 'plant' },
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: 'Spranghers et al. 2017, J. Sci. Food Agric. 97:2594–2600: prepupae on vegetable waste, dry-matter basis',
        confidence: 'derived',
        dryMatterPct: 92,
        publishedBasis: 'dry_matter',
        note: 'Published per kg DM (EE 371, ash 96 g/kg DM); shown as fed at 92 % DM (common practice for a dried meal).',
        values: { dm: 100, ee: 37.1, ash: 9.6 },
      },
      {
        sourceKind: 'table',
        sourceName: 'Spranghers et al. 2017: CP 399–431 g/kg DM across four substrates, midpoint; chitin 5–10 % DM midpoint (from memory)',
        confidence: 'from_memory',
        dryMatterPct: 92,
        publishedBasis: 'dry_matter',
        values: { cp: 41.5, chitin: 7.5 },
      },
    ],
  },
  {
    code: 'bsf-partially-defatted',
    name: 'Black soldier fly larvae meal, partially defatted',
    category: 'insect_meal',
    notes: 'Apparent ileal digestibility of amino acids in broilers 0.44–0.92 (mean 0.77). Tested at 250 g/kg of the test diet.',
    insect: { species: 'hermetia_illucens', processing: 'partially_defatted', substrate: 'Not stated in the source: record your supplier’s substrate', origin: 'unknown' },
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: 'Schiavone et al. 2017, J. Anim. Sci. Biotechnol. 8:51: AMEn 14.87 MJ/kg DM in broilers',
        confidence: 'derived',
        dryMatterPct: 94,
        publishedBasis: 'dry_matter',
        note: 'Published as 14.87 MJ/kg DM = 3,554 kcal/kg DM (1 kcal = 4.184 kJ); shown as fed at 94 % DM, an assumed meal dry matter.',
        values: { dm: 100, amen_poultry: 3554.02 },
      },
    ],
  },
  {
    code: 'bsf-defatted',
    name: 'Black soldier fly larvae meal, defatted',
    category: 'insect_meal',
    notes: 'Digestible amino acids as published; the source’s animal and basis were not visible in the excerpt read (presumed broilers, standardized ileal): confirm. The source gives AME 2,626 kcal/kg, not AMEn: enter AMEn from your own data.',
    insect: { species: 'hermetia_illucens', processing: 'defatted', substrate: 'Not stated in the source: record your supplier’s substrate', origin: 'unknown' },
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: 'Sci. Rep. 2025, article s41598-025-05624-7, Table 5: commercial defatted meal, as fed',
        confidence: 'verified',
        dryMatterPct: 97,
        values: {
          dm: 97, cp: 58.5, cf: 12, ash: 10, ee: 6, ca: 1.9, p: 0.96, na: 0.12, cl: 0.38, k: 1.62,
          lys: 3.04, met: 0.82, thr: 2.03, arg: 2.64, ile: 2.21, val: 3.16,
          dig_lys: 2.34, dig_met: 0.64, dig_thr: 1.48, dig_arg: 2.23, dig_ile: 1.75, dig_val: 2.53,
        },
      },
      {
        sourceKind: 'table',
        sourceName: 'Sci. Rep. 2025, s41598-025-05624-7, Table 5: Met + Cys as the sum of Met 0.82 + Cys 0.49 (total) and 0.64 + 0.38 (digestible)',
        confidence: 'derived',
        dryMatterPct: 97,
        values: { metcys: 1.31, dig_metcys: 1.02 },
      },
    ],
  },
  {
    code: 'mealworm-full-fat',
    name: 'Yellow mealworm larvae meal, full-fat',
    category: 'insect_meal',
    notes: 'Mean standardized ileal digestibility of amino acids in 21-day broilers 0.86 (Nascimento Filho et al.). Mealworm may accumulate arsenic (Schrögel & Wätjen 2019). Fat is 60–70 % unsaturated (Makkar et al. 2014).',
    insect: { species: 'tenebrio_molitor', processing: 'full_fat', substrate: 'Not stated in the source: record your supplier’s substrate', origin: 'unknown' },
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: 'Nascimento Filho et al., Univ. São Paulo, “Nutritional value of Tenebrio molitor larvae meal for broiler chickens”: AMEn 5,004 kcal/kg DM',
        confidence: 'derived',
        dryMatterPct: 94,
        publishedBasis: 'dry_matter',
        note: 'Published per kg DM; shown as fed at 94 % DM, an assumed meal dry matter.',
        values: { dm: 100, amen_poultry: 5004 },
      },
      {
        sourceKind: 'table',
        sourceName: 'CP 47–60 % and lipid about 30 % DM (Ravzanaadii 2012; Makkar et al. 2014, as cited by Nascimento Filho et al.): midpoint of the range; chitin 5–10 % DM midpoint (from memory)',
        confidence: 'from_memory',
        dryMatterPct: 94,
        publishedBasis: 'dry_matter',
        values: { cp: 53.5, ee: 30, chitin: 7.5 },
      },
    ],
  },
  {
    code: 'housefly-larvae',
    name: 'Housefly larvae meal',
    category: 'insect_meal',
    notes: 'High lysine, marginally low methionine. The source gives AME 14.23 MJ/kg DM for broilers, not AMEn: enter AMEn from your own data.',
    insect: { species: 'musca_domestica', processing: 'full_fat', substrate: 'Not stated in the source: record your supplier’s substrate', origin: 'unknown' },
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: 'Pieterse & Pretorius 2014, Anim. Prod. Sci. 54:347–355: larvae meal, dry-matter basis',
        confidence: 'derived',
        dryMatterPct: 92,
        publishedBasis: 'dry_matter',
        note: 'Published per kg DM; shown as fed at 92 % DM, an assumed meal dry matter.',
        values: { dm: 100, cp: 60.38, ee: 14.08, cf: 8.59 },
      },
    ],
  },
  {
    code: 'housefly-larvae-dairy-manure',
    name: 'Housefly larvae meal (dairy cattle manure)',
    category: 'insect_meal',
    notes: 'No significant n-3 fatty acids; fat 57 % monounsaturated. Manure is not an allowed rearing substrate in every country: check local feed law.',
    insect: { species: 'musca_domestica', processing: 'full_fat', substrate: 'Dairy cattle manure', origin: 'animal', animals: ['cattle'] },
    valueSets: [
      {
        sourceKind: 'table',
        sourceName: 'Hussein et al. 2017, PLoS ONE 12:e0171708: about 60 % protein and 20 % fat, Ca 0.5 %, P 1.1 %',
        confidence: 'from_memory',
        dryMatterPct: 92,
        publishedBasis: 'dry_matter',
        note: 'The basis of the published values was not visible in the excerpt read; taken as dry matter and shown as fed at 92 % DM (to confirm).',
        values: { dm: 100, cp: 60, ee: 20, ca: 0.5, p: 1.1 },
      },
    ],
  },
];
