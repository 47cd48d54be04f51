import { and, asc, desc, eq, inArray, isNull, or } from 'drizzle-orm';
import type { z } from 'zod';

import { allocate } from '../../../src/shared/engine/allocate';
import type { LpSolver } from '../../../src/shared/engine/lp-types';
import { buildFormulaProblem, ingredientKey, inputsFromSpecification, type LibraryIngredient } from '../../../src/shared/formula-problem';
import { checkInsectSubstrate } from '../../../src/shared/insect-rule';
import type { SpeciesFamily } from '../../../src/shared/library-terms';
import type { AllocationFormula, AllocationProblem, AllocationResult, Ingredient } from '../../../src/shared/schemas/formulation';
import type { NutrientInfo } from '../../../src/shared/schemas/formulas';
import type {
  allocateSupplyInput,
  createSupplyPlanInput,
  SupplyAllocationFormula,
  SupplyAllocationOptions,
  SupplyAllocationResponse,
  SupplyPlanDetail,
  SupplyPlanSummary,
  SupplyStream,
  updateSupplyPlanInput,
} from '../../../src/shared/schemas/supply';
import {
  DEFAULT_SOYBEAN_YIELD_T_PER_HA,
  mealRefusedFamilies,
  planSupply,
  plannedMealForRule,
  soybeanAreaForProtein,
  substrateFlags,
  type MealLabAnalysis,
  type SupplyStreamInput,
} from '../../../src/shared/supply';
import { badRequest, notFound } from '../../http/errors';
import type { Db } from '../client';
import {
  ingredientNutrientValues,
  ingredients,
  ingredientValueSets,
  nutrients,
  phases,
  species,
  specificationCaps,
  specificationNutrients,
  specificationRatios,
  specifications,
  supplyPlans,
  supplyStreams,
  type IngredientRow,
  type SupplyPlanRow,
  type SupplyStreamRow,
} from '../schema';
import { toNumber, versionConflict } from './library-shared';

type PlanInput = z.output<typeof createSupplyPlanInput>;
type PlanUpdate = z.output<typeof updateSupplyPlanInput>;
type AllocateInput = z.output<typeof allocateSupplyInput>;

/** Engine id of the planned meal in an allocation (library ingredients use their numeric id). */
export const PLANNED_MEAL_KEY = 'planned-meal';
const PLANNED_MEAL_LIBRARY_ID = 0;

const visibleIngredient = (organizationId: number) => or(isNull(ingredients.organizationId), eq(ingredients.organizationId, organizationId));

function toStream(row: SupplyStreamRow): SupplyStream {
  return {
    id: row.id,
    name: row.name,
    substrate: row.substrate,
    tonnesPerWeek: row.tonnesPerWeek,
    moisturePct: row.moisturePct,
    substrateCpDmPct: row.substrateCpDmPct,
    bioconversionDmPct: row.bioconversionDmPct,
    residueDmPct: row.residueDmPct,
    larvaeDryMatterPct: row.larvaeDryMatterPct,
    animals: row.animals,
  };
}

/** A stored stream as the pure plan reads it. */
export function streamForPlan(s: SupplyStream | PlanInput['streams'][number]): SupplyStreamInput {
  return {
    name: s.name,
    substrate: s.substrate,
    tonnesPerWeek: s.tonnesPerWeek,
    moisturePct: s.moisturePct,
    substrateCpDmPct: s.substrateCpDmPct,
    yields: { bioconversionDmPct: s.bioconversionDmPct ?? undefined, residueDmPct: s.residueDmPct ?? undefined, larvaeDryMatterPct: s.larvaeDryMatterPct ?? undefined },
    animals: s.animals ?? null,
  };
}

function summary(row: SupplyPlanRow, streams: SupplyStreamRow[]): SupplyPlanSummary {
  return {
    id: row.id,
    name: row.name,
    streamCount: streams.length,
    tonnesPerWeek: streams.reduce((s, x) => s + x.tonnesPerWeek, 0),
    defatted: row.defatted,
    version: row.version,
    updatedAt: row.updatedAt.toISOString(),
  };
}

export async function listSupplyPlans(db: Db, organizationId: number): Promise<SupplyPlanSummary[]> {
  const rows = await db.select().from(supplyPlans).where(eq(supplyPlans.organizationId, organizationId)).orderBy(asc(supplyPlans.name), asc(supplyPlans.id));
  const streams = rows.length ? await db.select().from(supplyStreams).where(inArray(supplyStreams.planId, rows.map((r) => r.id))) : [];
  return rows.map((r) => summary(r, streams.filter((s) => s.planId === r.id)));
}

async function findPlan(db: Db, organizationId: number, id: number): Promise<SupplyPlanRow> {
  const [row] = await db.select().from(supplyPlans).where(and(eq(supplyPlans.id, id), eq(supplyPlans.organizationId, organizationId)));
  if (!row) throw notFound('supply plan', id);
  return row;
}

/** The meal's library entry: its values per kg as fed, and its latest lab analysis of the five estimated items. */
async function mealIngredient(db: Db, organizationId: number, id: number): Promise<{ row: IngredientRow; values: Record<string, number>; lab: MealLabAnalysis | null } | null> {
  const [row] = await db.select().from(ingredients).where(and(eq(ingredients.id, id), visibleIngredient(organizationId)));
  if (!row) return null;
  const values = await db
    .select({ nutrientId: ingredientNutrientValues.nutrientId, value: ingredientNutrientValues.value, set: ingredientValueSets })
    .from(ingredientNutrientValues)
    .innerJoin(ingredientValueSets, eq(ingredientValueSets.id, ingredientNutrientValues.valueSetId))
    .where(eq(ingredientNutrientValues.ingredientId, id))
    .orderBy(desc(ingredientValueSets.id));
  const labValues = values.filter((v) => v.set.sourceKind === 'lab');
  let lab: MealLabAnalysis | null = null;
  if (labValues.length) {
    const latest = labValues[0].set;
    const own = labValues.filter((v) => v.set.id === latest.id && ['cp', 'ee', 'ash', 'ca', 'p'].includes(v.nutrientId));
    if (own.length) lab = { source: `${latest.sourceName}${latest.analysedOn ? `, ${latest.analysedOn}` : ''}`, dryMatterPct: latest.dryMatterPct, values: Object.fromEntries(own.map((v) => [v.nutrientId, v.value])) };
  }
  return { row, values: Object.fromEntries(values.map((v) => [v.nutrientId, v.value])), lab };
}

export async function getSupplyPlan(db: Db, organizationId: number, id: number): Promise<SupplyPlanDetail> {
  const row = await findPlan(db, organizationId, id);
  const streamRows = await db.select().from(supplyStreams).where(eq(supplyStreams.planId, id)).orderBy(asc(supplyStreams.position), asc(supplyStreams.id));
  const streams = streamRows.map(toStream);
  const meal = row.mealIngredientId ? await mealIngredient(db, organizationId, row.mealIngredientId) : null;
  const plan = planSupply(streams.map(streamForPlan), {
    defatted: row.defatted,
    residualFatPct: row.residualFatPct ?? undefined,
    mealDryMatterPct: row.mealDryMatterPct ?? undefined,
    residueMoisturePct: row.residueMoisturePct ?? undefined,
    labAnalysis: meal?.lab ?? null,
  });
  const ruleMeal = plannedMealForRule(row.name, streams.map(streamForPlan));
  const yieldSource = row.soybeanYieldTPerHa != null ? (row.soybeanYieldSource || 'Entered by the user (no source given)') : DEFAULT_SOYBEAN_YIELD_T_PER_HA.source;
  return {
    ...summary(row, streamRows),
    notes: row.notes,
    streams,
    residualFatPct: row.residualFatPct,
    mealDryMatterPct: row.mealDryMatterPct,
    residueMoisturePct: row.residueMoisturePct,
    mealIngredient: meal ? { id: meal.row.id, name: meal.row.name, labSource: meal.lab?.source ?? null } : null,
    soybeanYieldTPerHa: row.soybeanYieldTPerHa,
    soybeanYieldSource: row.soybeanYieldSource,
    soybeanCpPct: row.soybeanCpPct,
    weeksPerYear: row.weeksPerYear,
    plan,
    flags: substrateFlags(streams),
    speciesRule: {
      substrateAnimals: [...(ruleMeal.substrateAnimals ?? [])],
      refused: mealRefusedFamilies(ruleMeal).map((family) => {
        const verdict = checkInsectSubstrate(ruleMeal, family);
        return { family, message: verdict.allowed ? '' : verdict.message };
      }),
    },
    landUse: {
      ...soybeanAreaForProtein({
        mealProteinKgPerWeek: plan.processing.mealProteinKg,
        soybeanYieldTPerHa: row.soybeanYieldTPerHa ?? undefined,
        soybeanCpPct: row.soybeanCpPct ?? undefined,
        weeksPerYear: row.weeksPerYear ?? undefined,
      }),
      yieldSource,
    },
  };
}

async function checkMealIngredient(db: Db, organizationId: number, input: PlanInput) {
  if (!input.mealIngredientId) return;
  const [row] = await db.select().from(ingredients).where(and(eq(ingredients.id, input.mealIngredientId), visibleIngredient(organizationId)));
  if (!row || row.category !== 'insect_meal') throw badRequest('mealIngredientId: choose an insect meal from your library', { mealIngredientId: ['choose an insect meal from your library'] });
}

function planColumns(input: PlanInput) {
  return {
    name: input.name,
    notes: input.notes ?? null,
    defatted: input.defatted,
    residualFatPct: input.residualFatPct ?? null,
    mealDryMatterPct: input.mealDryMatterPct ?? null,
    residueMoisturePct: input.residueMoisturePct ?? null,
    mealIngredientId: input.mealIngredientId ?? null,
    soybeanYieldTPerHa: input.soybeanYieldTPerHa ?? null,
    soybeanYieldSource: input.soybeanYieldSource || null,
    soybeanCpPct: input.soybeanCpPct ?? null,
    weeksPerYear: input.weeksPerYear ?? null,
  };
}

async function writeStreams(tx: Db, planId: number, streams: PlanInput['streams']) {
  await tx.insert(supplyStreams).values(
    streams.map((s, position) => ({
      planId,
      position,
      name: s.name,
      substrate: s.substrate,
      tonnesPerWeek: s.tonnesPerWeek,
      moisturePct: s.moisturePct ?? null,
      substrateCpDmPct: s.substrateCpDmPct ?? null,
      bioconversionDmPct: s.bioconversionDmPct ?? null,
      residueDmPct: s.residueDmPct ?? null,
      larvaeDryMatterPct: s.larvaeDryMatterPct ?? null,
      animals: s.animals ?? null,
    })),
  );
}

export async function createSupplyPlan(db: Db, organizationId: number, userId: string | null, input: PlanInput): Promise<number> {
  await checkMealIngredient(db, organizationId, input);
  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const [{ id }] = await t.insert(supplyPlans).values({ organizationId, createdByUserId: userId, ...planColumns(input) }).$returningId();
    await writeStreams(t, id, input.streams);
    return id;
  });
}

/** Replaces a plan and its streams in one transaction; a stale version answers 409 and changes nothing. */
export async function updateSupplyPlan(db: Db, organizationId: number, id: number, input: PlanUpdate): Promise<void> {
  await checkMealIngredient(db, organizationId, input);
  await db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const [row] = await t.select().from(supplyPlans).where(and(eq(supplyPlans.id, id), eq(supplyPlans.organizationId, organizationId))).for('update');
    if (!row) throw notFound('supply plan', id);
    if (input.expectedVersion !== undefined && input.expectedVersion !== row.version) throw versionConflict('supply plan', row.version);
    await t.update(supplyPlans).set({ ...planColumns(input), version: row.version + 1 }).where(eq(supplyPlans.id, id));
    await t.delete(supplyStreams).where(eq(supplyStreams.planId, id));
    await writeStreams(t, id, input.streams);
  });
}

export async function deleteSupplyPlan(db: Db, organizationId: number, id: number): Promise<void> {
  await db.transaction(async (tx) => {
    const [row] = await tx.select().from(supplyPlans).where(and(eq(supplyPlans.id, id), eq(supplyPlans.organizationId, organizationId))).for('update');
    if (!row) throw notFound('supply plan', id);
    await tx.delete(supplyPlans).where(eq(supplyPlans.id, id));
  });
}

/** What the allocation form offers: visible specifications, the organization's own ingredients, its insect meals. */
export async function allocationOptions(db: Db, organizationId: number): Promise<SupplyAllocationOptions> {
  const specs = await db
    .select({ spec: specifications, species, phase: phases })
    .from(specifications)
    .innerJoin(species, eq(species.id, specifications.speciesId))
    .leftJoin(phases, eq(phases.id, specifications.phaseId))
    .where(or(isNull(specifications.organizationId), eq(specifications.organizationId, organizationId)))
    .orderBy(asc(species.sortOrder), asc(phases.sortOrder), asc(specifications.name));
  const own = await db.select().from(ingredients).where(eq(ingredients.organizationId, organizationId)).orderBy(asc(ingredients.name));
  const meals = own.filter((r) => r.category === 'insect_meal');
  const labSets = meals.length ? await db.select().from(ingredientValueSets).where(and(inArray(ingredientValueSets.ingredientId, meals.map((m) => m.id)), eq(ingredientValueSets.sourceKind, 'lab'))) : [];
  return {
    specifications: specs.map(({ spec, species: s, phase }) => ({ id: spec.id, name: spec.name, library: spec.organizationId === null ? 'reference' : 'own', speciesName: s.name, family: s.family, phaseName: phase?.name ?? null })),
    ingredients: own.map((r) => ({
      id: r.id,
      name: r.name,
      category: r.category,
      pricePerKg: toNumber(r.pricePerKg),
      refusedFamilies: (['poultry', 'swine'] as const).filter((f) => !checkInsectSubstrate(r, f).allowed),
    })),
    insectMeals: meals.map((m) => ({ id: m.id, name: m.name, hasLab: labSets.some((s) => s.ingredientId === m.id) })),
  };
}

async function loadLibrary(db: Db, organizationId: number, ids: number[]): Promise<Map<number, LibraryIngredient>> {
  const rows = ids.length ? await db.select().from(ingredients).where(and(inArray(ingredients.id, ids), visibleIngredient(organizationId))) : [];
  const values = rows.length ? await db.select().from(ingredientNutrientValues).where(inArray(ingredientNutrientValues.ingredientId, rows.map((r) => r.id))) : [];
  return new Map(
    rows.map((r) => [
      r.id,
      {
        id: r.id,
        name: r.name,
        category: r.category,
        insectSpecies: r.insectSpecies,
        substrate: r.substrate,
        substrateOrigin: r.substrateOrigin,
        substrateAnimals: r.substrateAnimals,
        pricePerKg: toNumber(r.pricePerKg),
        priceDate: r.priceDate,
        version: r.version,
        values: Object.fromEntries(values.filter((v) => v.ingredientId === r.id).map((v) => [v.nutrientId, v.value])),
      },
    ]),
  );
}

type LoadedSpec = {
  id: number;
  name: string;
  species: { name: string; family: SpeciesFamily };
  bounds: Parameters<typeof inputsFromSpecification>[0];
};

async function loadSpecifications(db: Db, organizationId: number, ids: number[]): Promise<Map<number, LoadedSpec>> {
  const rows = await db
    .select({ spec: specifications, species })
    .from(specifications)
    .innerJoin(species, eq(species.id, specifications.speciesId))
    .where(and(inArray(specifications.id, ids), or(isNull(specifications.organizationId), eq(specifications.organizationId, organizationId))));
  const out = new Map<number, LoadedSpec>();
  for (const { spec, species: s } of rows) {
    const bounds = await db.select().from(specificationNutrients).where(eq(specificationNutrients.specificationId, spec.id));
    const ratios = await db.select().from(specificationRatios).where(eq(specificationRatios.specificationId, spec.id));
    const caps = await db.select().from(specificationCaps).where(eq(specificationCaps.specificationId, spec.id));
    out.set(spec.id, {
      id: spec.id,
      name: spec.name,
      species: { name: s.name, family: s.family },
      bounds: {
        bounds: bounds.map((b) => ({ nutrientId: b.nutrientId, min: b.min, max: b.max })),
        ratios: ratios.map((r) => ({ numeratorId: r.numeratorId, denominatorId: r.denominatorId, min: r.min, max: r.max })),
        caps: caps.map((c) => ({ scope: c.scope, ingredientId: c.ingredientId, category: c.category, insectSpecies: c.insectSpecies, minPct: c.minPct, maxPct: c.maxPct, soft: c.soft, source: c.source })),
      },
    });
  }
  return out;
}

/**
 * The planned meal as a library ingredient: the plan's composition (as fed) for protein, fat, ash, Ca and P;
 * other values from the meal's library entry when the plan names one, amino acids scaled with the protein
 * (same amino-acid profile per unit of protein).
 */
function plannedMealIngredient(detail: SupplyPlanDetail, template: Record<string, number> | null, nutrientGroups: Map<string, string>, pricePerKg: number): { meal: LibraryIngredient; warnings: string[] } {
  const warnings: string[] = [];
  const estimated: Record<string, number> = Object.fromEntries(detail.plan.mealComposition.map((l) => [l.id, l.asFedPct]));
  estimated.dm = detail.plan.processing.mealDryMatterPct;
  const values: Record<string, number> = {};
  if (template) {
    const cpRatio = template.cp ? estimated.cp / template.cp : null;
    for (const [id, v] of Object.entries(template)) {
      if (id in estimated) continue;
      if (nutrientGroups.get(id) === 'amino_acids') {
        if (cpRatio !== null) values[id] = v * cpRatio;
      } else values[id] = v;
    }
    const hasEnergy = Object.keys(template).some((id) => nutrientGroups.get(id) === 'energy');
    if (!hasEnergy) warnings.push('The meal’s library entry has no energy value: the allocation counts the meal’s energy as 0, which undervalues it. Add an energy value to the library entry.');
  } else {
    warnings.push('No library entry is linked to this meal, so it carries only protein, fat, ash, calcium and phosphorus: energy and amino acids count as 0 and the meal is undervalued. Link the farm’s meal in the plan.');
  }
  Object.assign(values, estimated);
  const rule = plannedMealForRule(detail.name, detail.streams.map(streamForPlan));
  return {
    meal: {
      id: PLANNED_MEAL_LIBRARY_ID,
      name: `${detail.name} (planned meal)`,
      category: 'insect_meal',
      insectSpecies: 'hermetia_illucens',
      substrate: rule.substrate ?? null,
      substrateOrigin: rule.substrateOrigin ?? null,
      substrateAnimals: rule.substrateAnimals ?? null,
      pricePerKg,
      priceDate: null,
      version: detail.version,
      values,
    },
    warnings,
  };
}

/**
 * The week's allocation of the planned meal over the chosen formulas, solved twice: with the meal's weekly
 * amount as stock and with none, so the saving is the difference in total cost. The insect-protein rule keeps
 * the meal (and any library insect meal) out of the diets of the species whose by-products the larvae ate.
 */
export async function allocateSupply(db: Db, organizationId: number, planId: number, input: AllocateInput, largeSolver?: LpSolver): Promise<SupplyAllocationResponse> {
  const detail = await getSupplyPlan(db, organizationId, planId);
  const specs = await loadSpecifications(db, organizationId, [...new Set(input.formulas.map((f) => f.specificationId))]);
  const fieldErrors: Record<string, string[]> = {};
  input.formulas.forEach((f, k) => {
    if (!specs.has(f.specificationId)) fieldErrors[`formulas[${k}].specificationId`] = [`no requirement specification with id ${f.specificationId}`];
  });
  const library = await loadLibrary(db, organizationId, input.ingredients.map((i) => i.ingredientId));
  input.ingredients.forEach((i, k) => {
    const row = library.get(i.ingredientId);
    if (!row) fieldErrors[`ingredients[${k}].ingredientId`] = [`no ingredient with id ${i.ingredientId} in your library`];
    else if ((i.pricePerKg ?? row.pricePerKg) === null) fieldErrors[`ingredients[${k}].pricePerKg`] = [`${row.name} has no price in the library: enter today’s price per kg`];
  });
  const first = Object.entries(fieldErrors)[0];
  if (first) throw badRequest(`${first[0]}: ${first[1][0]}`, fieldErrors);

  const catalogue = await db.select().from(nutrients);
  const nutrientInfo = new Map<string, NutrientInfo>(catalogue.map((n) => [n.id, { id: n.id, name: n.name, unit: n.unit }]));
  const nutrientGroups = new Map(catalogue.map((n) => [n.id, n.nutrientGroup as string]));
  const template = detail.mealIngredient ? (await mealIngredient(db, organizationId, detail.mealIngredient.id))?.values ?? null : null;
  const { meal, warnings } = plannedMealIngredient(detail, template, nutrientGroups, input.mealPricePerKg);
  library.set(PLANNED_MEAL_LIBRARY_ID, meal);
  const mealKg = detail.plan.processing.mealKg;

  const shared = new Map<string, Ingredient>();
  const formulas: AllocationFormula[] = [];
  const rows: SupplyAllocationFormula[] = [];
  input.formulas.forEach((f, k) => {
    const spec = specs.get(f.specificationId)!;
    const verdict = checkInsectSubstrate(meal, spec.species.family, spec.species.name);
    const refusedIngredients: SupplyAllocationFormula['refusedIngredients'] = [];
    const choices = input.ingredients.flatMap((i) => {
      const row = library.get(i.ingredientId)!;
      const v = checkInsectSubstrate(row, spec.species.family, spec.species.name);
      if (!v.allowed) {
        refusedIngredients.push({ ingredientId: row.id, name: row.name, message: v.message });
        return [];
      }
      return [{ ingredientId: i.ingredientId, pricePerKg: i.pricePerKg ?? null, minPct: null, maxPct: null }];
    });
    if (verdict.allowed) choices.push({ ingredientId: PLANNED_MEAL_LIBRARY_ID, pricePerKg: null, minPct: null, maxPct: null });
    const inputs = inputsFromSpecification(spec.bounds, choices, f.tonnesPerWeek * 1000);
    const built = buildFormulaProblem(inputs, { library, nutrients: nutrientInfo, species: spec.species, name: spec.name });
    if (!built.ok) {
      const [path, messages] = Object.entries(built.fieldErrors)[0];
      throw badRequest(`formulas[${k}] (${spec.name}): ${path}: ${messages[0]}`, Object.fromEntries(Object.entries(built.fieldErrors).map(([p, m]) => [`formulas[${k}].${p}`, m])));
    }
    for (const ing of built.problem.ingredients) {
      const key = ing.id === ingredientKey(PLANNED_MEAL_LIBRARY_ID) ? PLANNED_MEAL_KEY : ing.id;
      const prev = shared.get(key);
      shared.set(key, { id: key, name: ing.name, pricePerKg: ing.pricePerKg, nutrients: { ...(prev?.nutrients ?? {}), ...(ing.nutrients ?? {}) } });
    }
    const rename = (id: string) => (id === ingredientKey(PLANNED_MEAL_LIBRARY_ID) ? PLANNED_MEAL_KEY : id);
    formulas.push({
      id: `formula-${k + 1}`,
      name: spec.name,
      batchKg: built.problem.batchKg,
      ingredients: built.problem.ingredients.map((i) => ({
        id: rename(i.id),
        ...(i.minPercent !== undefined ? { minPercent: i.minPercent } : {}),
        ...(i.maxPercent !== undefined ? { maxPercent: i.maxPercent } : {}),
        ...(i.pricePerKg !== undefined ? { pricePerKg: i.pricePerKg } : {}),
      })),
      nutrients: built.problem.nutrients ?? [],
      ratios: built.problem.ratios ?? [],
      groups: (built.problem.groups ?? []).map((g) => ({ ...g, members: g.members.map(rename) })),
    });
    rows.push({
      specificationId: spec.id,
      name: spec.name,
      speciesName: spec.species.name,
      family: spec.species.family,
      tonnesPerWeek: f.tonnesPerWeek,
      mealOffered: verdict.allowed,
      refusal: verdict.allowed ? null : verdict.message,
      refusedIngredients,
      mealKg: 0,
      mealPercent: 0,
      costPerTonne: null,
      costPerTonneWithoutMeal: null,
    });
  });

  const problem = (stockKg: number): AllocationProblem => ({
    name: detail.name,
    ingredients: [...shared.values()].map((i) => (i.id === PLANNED_MEAL_KEY ? { ...i, stockKg } : i)),
    formulas,
  });
  const withMeal = shared.has(PLANNED_MEAL_KEY) ? allocate(problem(mealKg), { largeSolver }) : null;
  const without = allocate(problem(0), { largeSolver });
  const result: AllocationResult = withMeal ?? without;
  if (!shared.has(PLANNED_MEAL_KEY)) warnings.push('The insect-protein rule keeps the meal out of every formula chosen: nothing to allocate.');

  const cost = (r: AllocationResult) => (r.status === 'optimal' ? r.totalCost : null);
  const stock = result.status === 'optimal' ? result.stocks.find((s) => s.id === PLANNED_MEAL_KEY) : undefined;
  const mealUsedKg = stock?.usedKg ?? 0;
  rows.forEach((row, k) => {
    const f = result.status === 'optimal' ? result.formulas.find((x) => x.id === `formula-${k + 1}`) : undefined;
    const w = without.status === 'optimal' ? without.formulas.find((x) => x.id === `formula-${k + 1}`) : undefined;
    const line = f?.mix.find((m) => m.id === PLANNED_MEAL_KEY);
    row.mealKg = line?.kg ?? 0;
    row.mealPercent = line?.percent ?? 0;
    row.costPerTonne = f?.costPerTonne ?? null;
    row.costPerTonneWithoutMeal = w?.costPerTonne ?? null;
  });
  const total = cost(result);
  const totalWithout = cost(without);
  const message = result.status === 'optimal' ? null : result.message;
  return {
    status: result.status,
    statusWithoutMeal: without.status,
    message,
    mealAvailableKg: mealKg,
    mealUsedKg,
    mealLeftKg: Math.max(0, mealKg - mealUsedKg),
    mealValuePerTonne: stock ? stock.valuePerTonne : null,
    totalCost: total,
    totalCostWithoutMeal: totalWithout,
    saving: total !== null && totalWithout !== null ? totalWithout - total : null,
    formulas: rows,
    warnings,
    result,
    resultWithoutMeal: without,
  };
}
