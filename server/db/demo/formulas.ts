/**
 * Demo formulas for Tamsby Cooperative Feed Mill (invented), so a newcomer sees every state at once:
 * a broiler grower with the larvae meal from Orrin Hollow in the mix, an approved broiler starter, a
 * grower pig diet, and a broiler finisher that cannot be made as set (no fat on hand this week).
 * Entered prices are invented for the demonstration.
 */
import { and, eq, inArray, isNull } from 'drizzle-orm';

import type { FormulaIngredientInput } from '../../../src/shared/schemas/formulas';
import type { Db } from '../client';
import { approveVersion, createFormula, keepVersion } from '../queries/formulas';
import { ingredientNutrientValues, ingredientPrices, ingredients, ingredientValueSets, memberships, organizations, priceColumn, specifications, users } from '../schema';

const MILL = 'Tamsby Cooperative Feed Mill';
const DEMO_MEAL_CODE = 'demo:orrin-hollow-partially-defatted';

/**
 * The mill's contract supply of partially defatted larvae meal from Orrin Hollow, with an invented lab
 * analysis (as fed) complete enough for a broiler diet: energy and amino acids. Demo data only.
 */
const DEMO_MEAL = {
  name: 'Larvae meal, partially defatted (Orrin Hollow contract)',
  notes: 'Contract supply from Orrin Hollow Larvae Farm: larvae reared on brewery spent grains and vegetable waste. Demo values.',
  pricePerKg: 0.68,
  priceDate: '2026-03-16',
  lab: 'Wendmere Feed Laboratory, report 26-0431 (demo)',
  dm: 94.2,
  values: {
    dm: 94.2, cp: 51.8, ee: 13.6, ash: 8.9, cf: 7.4, ca: 2.5, p: 0.88, avp: 0.7, na: 0.14, cl: 0.3, k: 1.3, amen_poultry: 3150,
    lys: 3.05, met: 0.86, metcys: 1.32, thr: 2.02, trp: 0.62, arg: 2.61, ile: 2.19, val: 3.02, leu: 3.45, linoleic: 1.9, lauric: 4.1, chitin: 5.8,
    dig_lys: 2.5, dig_met: 0.72, dig_metcys: 1.05, dig_thr: 1.6, dig_trp: 0.5, dig_arg: 2.2, dig_ile: 1.8, dig_val: 2.45, dig_leu: 2.85,
  },
};
const NUTRITIONIST = 'nutritionist@tamsby.example';

type Choice = { code: string; pricePerKg?: number; minPct?: number; maxPct?: number };

const POULTRY_BASE: Choice[] = [
  { code: 'maize' },
  { code: 'wheat', maxPct: 40 },
  { code: 'soybean-meal-48' },
  { code: 'soybean-oil' },
  { code: 'limestone' },
  { code: 'dicalcium-phosphate' },
  { code: 'salt' },
  { code: 'l-lysine-hcl' },
  { code: 'dl-methionine' },
  { code: 'l-threonine' },
];

export type DemoFormula = {
  name: string;
  specification: string;
  batchKg: number;
  ingredients: Choice[];
  note: string;
  approve?: boolean;
};

export const DEMO_FORMULAS: DemoFormula[] = [
  {
    name: 'Broiler grower with larvae meal',
    specification: 'nrc1994-broiler-grower',
    batchKg: 2000,
    ingredients: [...POULTRY_BASE, { code: DEMO_MEAL_CODE }],
    note: 'Orrin Hollow’s partially defatted larvae meal at the contract price takes the place of part of the soybean meal.',
  },
  {
    name: 'Broiler starter',
    specification: 'nrc1994-broiler-starter',
    batchKg: 2000,
    ingredients: [...POULTRY_BASE, { code: 'fish-meal-65', maxPct: 3 }, { code: 'bsf-full-fat-brewery' }],
    note: 'Standard starter for the spring placements.',
    approve: true,
  },
  {
    name: 'Grower pig 25–50 kg',
    specification: 'nrc2012-pig-25-50',
    batchKg: 4000,
    ingredients: [
      { code: 'maize' },
      { code: 'barley', maxPct: 30 },
      { code: 'soybean-meal-44' },
      { code: 'wheat-bran', maxPct: 10 },
      { code: 'limestone' },
      { code: 'dicalcium-phosphate' },
      { code: 'salt' },
      { code: 'l-lysine-hcl' },
      { code: 'dl-methionine' },
      { code: 'l-threonine' },
      { code: 'l-tryptophan' },
      { code: 'bsf-defatted' },
      { code: 'soybean-oil', maxPct: 3 },
    ],
    note: 'Grower diet for the finishing barns.',
  },
  {
    name: 'Broiler finisher without added fat',
    specification: 'nrc1994-broiler-grower',
    batchKg: 2000,
    ingredients: [{ code: 'maize' }, { code: 'soybean-meal-44' }, { code: 'limestone' }, { code: 'dicalcium-phosphate' }, { code: 'salt' }],
    note: 'No oil on hand this week: energy and protein cannot both be met as set.',
  },
];

async function addDemoMeal(tx: Db, organizationId: number): Promise<number> {
  const [{ id }] = await tx
    .insert(ingredients)
    .values({
      organizationId,
      name: DEMO_MEAL.name,
      category: 'insect_meal',
      notes: DEMO_MEAL.notes,
      insectSpecies: 'hermetia_illucens',
      insectProcessing: 'partially_defatted',
      substrate: 'Brewery spent grains and vegetable waste',
      substrateOrigin: 'plant',
      substrateAnimals: [],
      pricePerKg: priceColumn(DEMO_MEAL.pricePerKg),
      priceDate: DEMO_MEAL.priceDate,
    })
    .$returningId();
  const [{ id: setId }] = await tx
    .insert(ingredientValueSets)
    .values({ ingredientId: id, sourceKind: 'lab', sourceName: DEMO_MEAL.lab, confidence: 'verified', analysedOn: '2026-03-04', dryMatterPct: DEMO_MEAL.dm })
    .$returningId();
  await tx.insert(ingredientNutrientValues).values(Object.entries(DEMO_MEAL.values).map(([nutrientId, value]) => ({ ingredientId: id, nutrientId, valueSetId: setId, value })));
  await tx.insert(ingredientPrices).values({ ingredientId: id, pricePerKg: priceColumn(DEMO_MEAL.pricePerKg), effectiveOn: DEMO_MEAL.priceDate });
  return id;
}

async function ownIngredientIds(tx: Db, organizationId: number, codes: string[]): Promise<Map<string, number>> {
  const refs = await tx.select({ id: ingredients.id, code: ingredients.code }).from(ingredients).where(and(isNull(ingredients.organizationId), inArray(ingredients.code, codes)));
  const own = refs.length ? await tx.select({ id: ingredients.id, from: ingredients.copiedFromId }).from(ingredients).where(and(eq(ingredients.organizationId, organizationId), inArray(ingredients.copiedFromId, refs.map((r) => r.id)))) : [];
  const out = new Map<string, number>();
  for (const r of refs) {
    const copy = own.find((o) => o.from === r.id);
    out.set(r.code!, copy?.id ?? r.id);
  }
  return out;
}

async function specificationId(tx: Db, organizationId: number, code: string): Promise<number | null> {
  const [ref] = await tx.select({ id: specifications.id }).from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, code)));
  if (!ref) return null;
  const [own] = await tx.select({ id: specifications.id }).from(specifications).where(and(eq(specifications.organizationId, organizationId), eq(specifications.copiedFromId, ref.id)));
  return own?.id ?? ref.id;
}

/** Seed step: the demo formulas, each with one kept version; the starter approved by the nutritionist. */
export async function seedDemoFormulas(tx: Db): Promise<void> {
  const [mill] = await tx.select({ id: organizations.id }).from(organizations).where(eq(organizations.name, MILL));
  const [person] = await tx
    .select({ id: users.id })
    .from(users)
    .innerJoin(memberships, eq(memberships.userId, users.id))
    .where(and(eq(users.email, NUTRITIONIST), eq(memberships.organizationId, mill?.id ?? -1)));
  if (!mill || !person) return;
  const codes = [...new Set(DEMO_FORMULAS.flatMap((f) => f.ingredients.map((i) => i.code)))];
  const ids = await ownIngredientIds(tx, mill.id, codes);
  ids.set(DEMO_MEAL_CODE, await addDemoMeal(tx, mill.id));
  for (const demo of DEMO_FORMULAS) {
    const specId = await specificationId(tx, mill.id, demo.specification);
    if (!specId) continue;
    const chosen: FormulaIngredientInput[] = demo.ingredients
      .filter((c) => ids.has(c.code))
      .map((c) => ({ ingredientId: ids.get(c.code)!, pricePerKg: c.pricePerKg ?? null, minPct: c.minPct ?? null, maxPct: c.maxPct ?? null }));
    const formulaId = await createFormula(tx, mill.id, person.id, { name: demo.name, specificationId: specId, batchKg: demo.batchKg, ingredients: chosen });
    const versionId = await keepVersion(tx, mill.id, person.id, formulaId, undefined, demo.note);
    if (demo.approve) await approveVersion(tx, mill.id, person.id, formulaId, versionId);
  }
}
