/**
 * Detergent fibre fractions (NDF and ADF), added to the nutrient catalogue after its first version, with
 * the reference values a checked source gives. Written by the seed step `reference-fibre-v1`, so
 * databases that already hold the library receive them too. The pig energy equations read `adf` and `ndf`.
 */
import { and, eq, inArray, isNull, like, sql } from 'drizzle-orm';

import { dryMatterToAsFed } from '../../../src/shared/units';
import type { Db } from '../client';
import { ingredientNutrientValues, ingredients, ingredientValueSets, nutrients, type NewNutrientRow } from '../schema';
import { NUTRIENT_CATALOGUE } from './nutrients';

const CRUDE_FIBRE_ORDER = NUTRIENT_CATALOGUE.find((n) => n.id === 'cf')?.sortOrder ?? 440;

/** NDF and ADF, listed right after crude fibre. Per kg of feed as fed, like every catalogue value. */
export const FIBRE_NUTRIENTS: NewNutrientRow[] = [
  {
    id: 'ndf',
    name: 'Neutral detergent fibre (NDF)',
    unit: '%',
    nutrientGroup: 'fat_and_fibre',
    families: ['poultry', 'swine'],
    sortOrder: CRUDE_FIBRE_ORDER + 3,
    description: 'Cell walls: hemicellulose, cellulose and lignin (in insect meals, chitin as well). aNDF when the lab used heat-stable amylase. Used by the pig DE equation.',
  },
  {
    id: 'adf',
    name: 'Acid detergent fibre (ADF)',
    unit: '%',
    nutrientGroup: 'fat_and_fibre',
    families: ['poultry', 'swine'],
    sortOrder: CRUDE_FIBRE_ORDER + 6,
    description: 'Cellulose and lignin (in insect meals, chitin as well). Used by the pig net-energy equations.',
  },
];

/**
 * Published fibre values of reference ingredients, per kg DM as printed, added to the value set that
 * holds the rest of the same table. Only values read in the source are listed here.
 */
export const REFERENCE_FIBRE_VALUES: { ingredientCode: string; valueSetSource: string; values: { adf?: number; ndf?: number }; note: string }[] = [
  {
    // Animals 2020, 10:682 (PMC7222827), Table 1: larvae on brewers' by-product, aNDF 13.0 and ADF 7.92 % DM.
    ingredientCode: 'bsf-full-fat-brewery',
    valueSetSource: 'Animals 2020, 10:682',
    values: { ndf: 13.0, adf: 7.92 },
    note: 'NDF is aNDF (13.0 % DM) and ADF 7.92 % DM, from the same Table 1.',
  },
];

/** Rounds away floating-point dust from the DM → as-fed conversion (6 decimals, like the first library version). */
const tidy = (value: number) => Math.round(value * 1e6) / 1e6;

/** Adds NDF and ADF to the catalogue and their checked values to the reference ingredients (needs `reference-library-v1`). */
export async function seedReferenceFibre(tx: Db): Promise<void> {
  const present = new Set((await tx.select({ id: nutrients.id }).from(nutrients).where(inArray(nutrients.id, FIBRE_NUTRIENTS.map((n) => n.id)))).map((n) => n.id));
  const missing = FIBRE_NUTRIENTS.filter((n) => !present.has(n.id));
  if (missing.length) await tx.insert(nutrients).values(missing);

  for (const entry of REFERENCE_FIBRE_VALUES) {
    const [ingredient] = await tx.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, entry.ingredientCode)));
    if (!ingredient) throw new Error(`The reference library has no ingredient ${entry.ingredientCode}: apply reference-library-v1 first.`);
    const [set] = await tx
      .select()
      .from(ingredientValueSets)
      .where(and(eq(ingredientValueSets.ingredientId, ingredient.id), like(ingredientValueSets.sourceName, `${entry.valueSetSource}%`)));
    if (!set) throw new Error(`${entry.ingredientCode} has no value set from ${entry.valueSetSource}.`);
    const had = new Set((await tx.select({ id: ingredientNutrientValues.nutrientId }).from(ingredientNutrientValues).where(eq(ingredientNutrientValues.ingredientId, ingredient.id))).map((v) => v.id));
    const rows = Object.entries(entry.values)
      .filter(([nutrientId]) => !had.has(nutrientId))
      .map(([nutrientId, onDryMatter]) => ({ ingredientId: ingredient.id, nutrientId, valueSetId: set.id, value: tidy(dryMatterToAsFed(onDryMatter, set.dryMatterPct)) }));
    if (rows.length === 0) continue;
    await tx.insert(ingredientNutrientValues).values(rows);
    await tx.update(ingredientValueSets).set({ note: [set.note, entry.note].filter(Boolean).join(' ').slice(0, 500) }).where(eq(ingredientValueSets.id, set.id));
    // The ingredient changed: a formula solved with it can tell which state it used.
    await tx.update(ingredients).set({ version: sql`${ingredients.version} + 1` }).where(eq(ingredients.id, ingredient.id));
  }
}

/** The seed step that adds NDF and ADF; it runs once per database, after `reference-library-v1`. */
export const REFERENCE_FIBRE_STEP = { name: 'reference-fibre-v1', apply: (tx: Db) => seedReferenceFibre(tx) };
