/**
 * Demo libraries for the invented organizations: each gets its own copy of the reference library, dated
 * prices, and a few things of its own (an in-house larvae meal with a lab analysis, copied specifications).
 * Prices and lab values here are invented for the demonstration.
 */
import { eq, inArray } from 'drizzle-orm';

import type { Db } from '../client';
import { ingredientNutrientValues, ingredientPrices, ingredients, ingredientValueSets, organizations, priceColumn } from '../schema';
import { copyIngredientsToOrganization, copySpecificationToOrganization, referenceSpecificationIds } from './seed-library';

/** Invented prices per kg as fed, three weekly quotes (oldest first), by reference code. */
const DEMO_PRICES: Record<string, [number, number, number]> = {
  maize: [0.231, 0.236, 0.229],
  wheat: [0.244, 0.241, 0.247],
  barley: [0.212, 0.214, 0.215],
  'soybean-meal-44': [0.452, 0.46, 0.471],
  'soybean-meal-48': [0.498, 0.505, 0.512],
  'canola-meal': [0.338, 0.341, 0.336],
  'corn-ddgs': [0.262, 0.259, 0.255],
  'wheat-bran': [0.168, 0.17, 0.171],
  'fish-meal-65': [1.58, 1.61, 1.63],
  'soybean-oil': [1.12, 1.1, 1.14],
  limestone: [0.062, 0.062, 0.063],
  'dicalcium-phosphate': [0.71, 0.72, 0.72],
  'monocalcium-phosphate': [0.83, 0.84, 0.84],
  salt: [0.11, 0.11, 0.11],
  'sodium-bicarbonate': [0.46, 0.46, 0.47],
  'l-lysine-hcl': [1.62, 1.6, 1.58],
  'dl-methionine': [3.05, 3.1, 3.08],
  'l-threonine': [1.9, 1.88, 1.92],
  'l-tryptophan': [9.6, 9.4, 9.5],
  'vitamin-mineral-premix': [2.4, 2.4, 2.45],
  'bsf-full-fat-brewery': [1.35, 1.32, 1.3],
  'bsf-defatted': [1.78, 1.75, 1.74],
  'mealworm-full-fat': [2.6, 2.55, 2.55],
  'housefly-larvae': [1.45, 1.45, 1.42],
};
const PRICE_DATES = ['2026-03-02', '2026-03-09', '2026-03-16'];

async function orgId(tx: Db, name: string): Promise<number | null> {
  const [row] = await tx.select({ id: organizations.id }).from(organizations).where(eq(organizations.name, name));
  return row?.id ?? null;
}

async function seedPrices(tx: Db, copies: Map<number, number>) {
  const refs = await tx.select({ id: ingredients.id, code: ingredients.code }).from(ingredients).where(inArray(ingredients.id, [...copies.keys()]));
  for (const ref of refs) {
    const quotes = ref.code ? DEMO_PRICES[ref.code] : undefined;
    const ownId = copies.get(ref.id);
    if (!quotes || !ownId) continue;
    await tx.insert(ingredientPrices).values(quotes.map((price, i) => ({ ingredientId: ownId, pricePerKg: priceColumn(price), effectiveOn: PRICE_DATES[i] })));
    await tx.update(ingredients).set({ pricePerKg: priceColumn(quotes[2]), priceDate: PRICE_DATES[2] }).where(eq(ingredients.id, ownId));
  }
}

/** An organization's own insect meal with one invented lab analysis (as fed). */
async function addOwnInsectMeal(
  tx: Db,
  organizationId: number,
  meal: { name: string; notes: string; processing: 'full_fat' | 'defatted'; substrate: string; origin: 'plant' | 'animal'; animals: ('chicken' | 'pig' | 'fish')[]; price: number; lab: string; dm: number; values: Record<string, number> },
) {
  const [{ id }] = await tx
    .insert(ingredients)
    .values({
      organizationId,
      name: meal.name,
      category: 'insect_meal',
      notes: meal.notes,
      insectSpecies: 'hermetia_illucens',
      insectProcessing: meal.processing,
      substrate: meal.substrate,
      substrateOrigin: meal.origin,
      substrateAnimals: meal.animals,
      pricePerKg: priceColumn(meal.price),
      priceDate: PRICE_DATES[2],
    })
    .$returningId();
  const [{ id: setId }] = await tx
    .insert(ingredientValueSets)
    .values({ ingredientId: id, sourceKind: 'lab', sourceName: meal.lab, confidence: 'verified', analysedOn: '2026-02-20', dryMatterPct: meal.dm })
    .$returningId();
  await tx.insert(ingredientNutrientValues).values(Object.entries({ dm: meal.dm, ...meal.values }).map(([nutrientId, value]) => ({ ingredientId: id, nutrientId, valueSetId: setId, value })));
  await tx.insert(ingredientPrices).values({ ingredientId: id, pricePerKg: priceColumn(meal.price), effectiveOn: PRICE_DATES[2] });
}

export async function seedDemoLibraries(tx: Db): Promise<void> {
  const mill = await orgId(tx, 'Tamsby Cooperative Feed Mill');
  const farm = await orgId(tx, 'Orrin Hollow Larvae Farm');
  const office = await orgId(tx, 'Upper Wend Extension Office');
  for (const id of [mill, farm, office]) {
    if (id === null) continue;
    await seedPrices(tx, await copyIngredientsToOrganization(tx, id));
  }
  if (farm !== null) {
    await addOwnInsectMeal(tx, farm, {
      name: 'Orrin Hollow larvae meal, full-fat (brewery grains and vegetable waste)',
      notes: 'Our own larvae, dried and milled on the farm. Re-analyse every new substrate mix.',
      processing: 'full_fat',
      substrate: 'Brewery spent grains and vegetable waste',
      origin: 'plant',
      animals: [],
      price: 1.18,
      lab: 'Wendmere Feed Laboratory, report 26-0412',
      dm: 93.1,
      values: { cp: 42.6, ee: 31.8, ash: 7.9, cf: 8.1, ca: 2.4, p: 0.71, chitin: 6.2, lauric: 8.9 },
    });
  }
  if (mill !== null) {
    await addOwnInsectMeal(tx, mill, {
      name: 'Larvae meal, defatted (poultry processing offal)',
      notes: 'Offered by a trader for pig diets only: the larvae were reared on poultry offal.',
      processing: 'defatted',
      substrate: 'Poultry processing offal',
      origin: 'animal',
      animals: ['chicken'],
      price: 1.52,
      lab: 'Wendmere Feed Laboratory, report 26-0388',
      dm: 95.4,
      values: { cp: 55.2, ee: 9.7, ash: 9.4, cf: 9.9, ca: 2.8, p: 0.92, sid_lys: 2.5 },
    });
    const specs = await referenceSpecificationIds(tx, ['nrc1994-broiler-starter', 'nrc1994-broiler-grower', 'nrc2012-pig-25-50']);
    for (const [code, id] of specs) {
      await copySpecificationToOrganization(tx, mill, id, code === 'nrc2012-pig-25-50' ? 'Tamsby grower pig 25–50 kg' : undefined);
    }
  }
}
