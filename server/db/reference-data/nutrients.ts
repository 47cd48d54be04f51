import type { NewNutrientRow } from '../schema';

const AMINO_ACIDS = [
  ['lys', 'Lysine'],
  ['met', 'Methionine'],
  ['metcys', 'Methionine + cysteine'],
  ['thr', 'Threonine'],
  ['trp', 'Tryptophan'],
  ['arg', 'Arginine'],
  ['ile', 'Isoleucine'],
  ['val', 'Valine'],
  ['leu', 'Leucine'],
] as const;

/** Amino-acid codes as used in nutrient ids: `lys` (total), `dig_lys` (poultry digestible), `sid_lys` (swine SID). */
export const AMINO_ACID_CODES = AMINO_ACIDS.map(([code]) => code);

let order = 0;
const next = () => (order += 10);

/**
 * The nutrient catalogue. Values are per kg of feed as fed. Each amino-acid basis is its own nutrient:
 * total (both families), digestible for poultry, standardized ileal digestible (SID) for pigs.
 */
export const NUTRIENT_CATALOGUE: NewNutrientRow[] = [
  { id: 'dm', name: 'Dry matter', unit: '%', nutrientGroup: 'proximate', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'cp', name: 'Crude protein', unit: '%', nutrientGroup: 'proximate', families: ['poultry', 'swine'], sortOrder: next(), description: 'N × 6.25 unless the source says otherwise (insect meals: see the value set).' },
  { id: 'ash', name: 'Ash', unit: '%', nutrientGroup: 'proximate', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'starch', name: 'Starch', unit: '%', nutrientGroup: 'proximate', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'amen_poultry', name: 'AMEn (poultry)', unit: 'kcal/kg', nutrientGroup: 'energy', families: ['poultry'], sortOrder: next(), description: 'Nitrogen-corrected apparent metabolizable energy for poultry.' },
  { id: 'de_swine', name: 'DE (pigs)', unit: 'kcal/kg', nutrientGroup: 'energy', families: ['swine'], sortOrder: next(), description: 'Digestible energy for pigs.' },
  { id: 'me_swine', name: 'ME (pigs)', unit: 'kcal/kg', nutrientGroup: 'energy', families: ['swine'], sortOrder: next(), description: 'Metabolizable energy for pigs.' },
  { id: 'ne_swine', name: 'NE (pigs)', unit: 'kcal/kg', nutrientGroup: 'energy', families: ['swine'], sortOrder: next(), description: 'Net energy for pigs.' },
  ...AMINO_ACIDS.map(([code, name]): NewNutrientRow => ({ id: code, name: `${name}, total`, unit: '%', nutrientGroup: 'amino_acids', families: ['poultry', 'swine'], basis: 'total', sortOrder: next() })),
  ...AMINO_ACIDS.map(([code, name]): NewNutrientRow => ({ id: `dig_${code}`, name: `${name}, digestible (poultry)`, unit: '%', nutrientGroup: 'amino_acids', families: ['poultry'], basis: 'digestible', sortOrder: next() })),
  ...AMINO_ACIDS.map(([code, name]): NewNutrientRow => ({ id: `sid_${code}`, name: `SID ${name.toLowerCase()} (pigs)`, unit: '%', nutrientGroup: 'amino_acids', families: ['swine'], basis: 'sid', sortOrder: next() })),
  { id: 'ca', name: 'Calcium', unit: '%', nutrientGroup: 'minerals', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'p', name: 'Phosphorus, total', unit: '%', nutrientGroup: 'minerals', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'avp', name: 'Available (non-phytate) P (poultry)', unit: '%', nutrientGroup: 'minerals', families: ['poultry'], sortOrder: next() },
  { id: 'sttd_p', name: 'STTD phosphorus (pigs)', unit: '%', nutrientGroup: 'minerals', families: ['swine'], sortOrder: next(), description: 'Standardized total tract digestible phosphorus.' },
  { id: 'na', name: 'Sodium', unit: '%', nutrientGroup: 'minerals', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'cl', name: 'Chloride', unit: '%', nutrientGroup: 'minerals', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'k', name: 'Potassium', unit: '%', nutrientGroup: 'minerals', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'ee', name: 'Crude fat (ether extract)', unit: '%', nutrientGroup: 'fat_and_fibre', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'cf', name: 'Crude fibre', unit: '%', nutrientGroup: 'fat_and_fibre', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'linoleic', name: 'Linoleic acid (C18:2)', unit: '%', nutrientGroup: 'fat_and_fibre', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'lauric', name: 'Lauric acid (C12:0)', unit: '%', nutrientGroup: 'fat_and_fibre', families: ['poultry', 'swine'], sortOrder: next() },
  { id: 'chitin', name: 'Chitin', unit: '%', nutrientGroup: 'insect', families: ['poultry', 'swine'], sortOrder: next(), description: 'Insect exoskeleton fibre; its nitrogen inflates crude protein by N × 6.25.' },
];
