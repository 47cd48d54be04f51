import { and, asc, count, desc, eq, inArray, isNull, like, or, sql, type SQL } from 'drizzle-orm';

import { checkInsectSubstrate, refusedFamilies } from '../../../src/shared/insect-rule';
import type { OriginAnimal } from '../../../src/shared/library-terms';
import type { z } from 'zod';

import type { LabValue } from '../../../src/shared/lab-import/types';
import type {
  createIngredientInput,
  IngredientDetail,
  IngredientSummary,
  InsectDetails,
  ListIngredientsQuery,
  updateIngredientInput,
} from '../../../src/shared/schemas/ingredients';
import type { KeptValue } from '../../../src/shared/schemas/lab-imports';
import type { Page } from '../../../src/shared/schemas/library-common';
import { badRequest, HttpError, notFound } from '../../http/errors';
import type { Db } from '../client';
import { copyIngredientsToOrganization } from '../reference-data/seed-library';
import { formulas, ingredientNutrientValues, ingredientPrices, ingredients, ingredientValueSets, priceColumn, species, specificationCaps, specifications, supplyPlans, type IngredientRow } from '../schema';
import { checkNutrientValues, likePattern, readOnlyReference, toNumber, today, versionConflict } from './library-shared';

type CreateInput = z.output<typeof createIngredientInput>;
type UpdateInput = z.output<typeof updateIngredientInput>;

/** Values shown in lists and tables without opening the ingredient. */
export const SUMMARY_NUTRIENTS = ['dm', 'cp', 'ee', 'cf', 'ash', 'ca', 'p', 'avp', 'sttd_p', 'amen_poultry', 'ne_swine', 'lys', 'dig_lys', 'sid_lys'];

const visibleTo = (organizationId: number) => or(isNull(ingredients.organizationId), eq(ingredients.organizationId, organizationId));

function insectOf(row: IngredientRow): InsectDetails | null {
  if (row.category !== 'insect_meal' || !row.insectSpecies || !row.insectProcessing || !row.substrateOrigin) return null;
  return { species: row.insectSpecies, processing: row.insectProcessing, substrate: row.substrate ?? '', substrateOrigin: row.substrateOrigin, substrateAnimals: (row.substrateAnimals ?? []) as OriginAnimal[] };
}

function ruleInput(row: IngredientRow) {
  return { name: row.name, category: row.category, substrate: row.substrate, substrateOrigin: row.substrateOrigin, substrateAnimals: row.substrateAnimals };
}

function summarize(row: IngredientRow, values: Record<string, number>): IngredientSummary {
  return {
    id: row.id,
    library: row.organizationId === null ? 'reference' : 'own',
    name: row.name,
    category: row.category,
    insect: insectOf(row),
    pricePerKg: toNumber(row.pricePerKg),
    priceDate: row.priceDate,
    version: row.version,
    values,
    refusals: refusedFamilies(ruleInput(row)).map((family) => {
      const verdict = checkInsectSubstrate(ruleInput(row), family);
      return { family, message: verdict.allowed ? '' : verdict.message };
    }),
  };
}

/** An ingredient this organization can see (its own or the reference library's), or 404. */
export async function findVisibleIngredient(db: Db, organizationId: number, id: number): Promise<IngredientRow> {
  const [row] = await db.select().from(ingredients).where(and(eq(ingredients.id, id), visibleTo(organizationId)));
  if (!row) throw notFound('ingredient', id);
  return row;
}

/** An ingredient of this organization's own library, locked for the transaction; 404 or read-only otherwise. */
async function lockOwnIngredient(tx: Db, organizationId: number, id: number): Promise<IngredientRow> {
  const [row] = await tx.select().from(ingredients).where(and(eq(ingredients.id, id), visibleTo(organizationId))).for('update');
  if (!row) throw notFound('ingredient', id);
  if (row.organizationId === null) throw readOnlyReference('ingredient');
  return row;
}

export async function listIngredients(db: Db, organizationId: number, q: ListIngredientsQuery): Promise<Page<IngredientSummary>> {
  const where: SQL[] = [q.library === 'reference' ? isNull(ingredients.organizationId) : eq(ingredients.organizationId, organizationId)];
  if (q.category) where.push(eq(ingredients.category, q.category));
  if (q.search) where.push(like(ingredients.name, likePattern(q.search)));
  const filter = and(...where);
  let target: { name: string; family: 'poultry' | 'swine' } | null = null;
  if (q.speciesId) {
    const [s] = await db.select().from(species).where(and(eq(species.id, q.speciesId), or(isNull(species.organizationId), eq(species.organizationId, organizationId))));
    if (!s) throw notFound('species', q.speciesId);
    target = s;
  }
  const [{ total }] = await db.select({ total: count() }).from(ingredients).where(filter);
  const rows = await db.select().from(ingredients).where(filter).orderBy(asc(ingredients.name), asc(ingredients.id)).limit(q.pageSize).offset((q.page - 1) * q.pageSize);
  const values = await valuesOf(db, rows.map((r) => r.id), SUMMARY_NUTRIENTS);
  const items = rows.map((row) => {
    const summary = summarize(row, values.get(row.id) ?? {});
    if (target) {
      const verdict = checkInsectSubstrate(ruleInput(row), target.family, target.name);
      summary.offered = { allowed: verdict.allowed, message: verdict.allowed ? null : verdict.message };
    }
    return summary;
  });
  return { items, total, page: q.page, pageSize: q.pageSize };
}

async function valuesOf(db: Db, ids: number[], only?: string[]): Promise<Map<number, Record<string, number>>> {
  const out = new Map<number, Record<string, number>>();
  if (ids.length === 0) return out;
  const where = only ? and(inArray(ingredientNutrientValues.ingredientId, ids), inArray(ingredientNutrientValues.nutrientId, only)) : inArray(ingredientNutrientValues.ingredientId, ids);
  for (const v of await db.select().from(ingredientNutrientValues).where(where)) {
    const map = out.get(v.ingredientId) ?? {};
    map[v.nutrientId] = v.value;
    out.set(v.ingredientId, map);
  }
  return out;
}

export async function getIngredient(db: Db, organizationId: number, id: number): Promise<IngredientDetail> {
  const row = await findVisibleIngredient(db, organizationId, id);
  const values = await db.select().from(ingredientNutrientValues).where(eq(ingredientNutrientValues.ingredientId, id));
  const sets = await db.select().from(ingredientValueSets).where(eq(ingredientValueSets.ingredientId, id)).orderBy(asc(ingredientValueSets.id));
  const prices = await db.select().from(ingredientPrices).where(eq(ingredientPrices.ingredientId, id)).orderBy(desc(ingredientPrices.effectiveOn), desc(ingredientPrices.id)).limit(20);
  const all = Object.fromEntries(values.map((v) => [v.nutrientId, v.value]));
  const summaryValues = Object.fromEntries(Object.entries(all).filter(([k]) => SUMMARY_NUTRIENTS.includes(k)));
  return {
    ...summarize(row, summaryValues),
    notes: row.notes,
    copiedFromId: row.copiedFromId,
    nutrientValues: values.map((v) => ({ nutrientId: v.nutrientId, value: v.value, valueSetId: v.valueSetId })),
    valueSets: sets.map((s) => ({ id: s.id, sourceKind: s.sourceKind, sourceName: s.sourceName, confidence: s.confidence, analysedOn: s.analysedOn, dryMatterPct: s.dryMatterPct, note: s.note })),
    prices: prices.map((p) => ({ id: p.id, pricePerKg: Number(p.pricePerKg), effectiveOn: p.effectiveOn, recordedAt: p.recordedAt.toISOString() })),
    updatedAt: row.updatedAt.toISOString(),
  };
}

function insectColumns(input: { category?: string; insect?: CreateInput['insect'] }) {
  const insect = input.category === 'insect_meal' ? input.insect : null;
  return {
    insectSpecies: insect?.species ?? null,
    insectProcessing: insect?.processing ?? null,
    substrate: insect?.substrate ?? null,
    substrateOrigin: insect?.substrateOrigin ?? null,
    substrateAnimals: insect ? insect.substrateAnimals : null,
  };
}

async function insertValueSet(tx: Db, ingredientId: number, source: NonNullable<CreateInput['source']>, values: Record<string, number>) {
  const entries = Object.entries(values);
  if (entries.length === 0) return;
  const [{ id: valueSetId }] = await tx
    .insert(ingredientValueSets)
    .values({ ingredientId, sourceKind: source.kind, sourceName: source.name, confidence: source.confidence, analysedOn: source.analysedOn ?? null, dryMatterPct: source.dryMatterPct })
    .$returningId();
  await tx.delete(ingredientNutrientValues).where(and(eq(ingredientNutrientValues.ingredientId, ingredientId), inArray(ingredientNutrientValues.nutrientId, entries.map(([k]) => k))));
  await tx.insert(ingredientNutrientValues).values(entries.map(([nutrientId, value]) => ({ ingredientId, nutrientId, valueSetId, value })));
}

/** Value sets left without values are removed, so every source shown still backs a number. */
async function dropEmptyValueSets(tx: Db, ingredientId: number) {
  await tx.execute(sql`DELETE FROM ${ingredientValueSets} WHERE ${ingredientValueSets.ingredientId} = ${ingredientId} AND NOT EXISTS (SELECT 1 FROM ${ingredientNutrientValues} WHERE ${ingredientNutrientValues.valueSetId} = ${ingredientValueSets.id})`);
}

export async function createIngredient(db: Db, organizationId: number, userId: string, input: CreateInput): Promise<number> {
  await checkNutrientValues(db, input.values);
  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const price = input.pricePerKg ?? null;
    const priceDate = price === null ? null : (input.priceDate ?? today());
    const [{ id }] = await t
      .insert(ingredients)
      .values({ organizationId, name: input.name, category: input.category, notes: input.notes ?? null, ...insectColumns(input), pricePerKg: price === null ? null : priceColumn(price), priceDate })
      .$returningId();
    const values = Object.fromEntries(Object.entries(input.values).filter((e): e is [string, number] => e[1] !== null));
    if (input.source) await insertValueSet(t, id, input.source, values);
    if (price !== null && priceDate) await t.insert(ingredientPrices).values({ ingredientId: id, pricePerKg: priceColumn(price), effectiveOn: priceDate, recordedByUserId: userId });
    return id;
  });
}

export async function updateIngredient(db: Db, organizationId: number, id: number, input: UpdateInput): Promise<void> {
  if (input.values) await checkNutrientValues(db, input.values);
  await db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const row = await lockOwnIngredient(t, organizationId, id);
    if (input.expectedVersion !== undefined && input.expectedVersion !== row.version) throw versionConflict('ingredient', row.version);
    const category = input.category ?? row.category;
    if (category === 'insect_meal' && input.insect === undefined && row.category !== 'insect_meal') throw badRequest('insect: an insect meal needs its insect, processing and rearing substrate', { insect: ['an insect meal needs its insect, processing and rearing substrate'] });
    if (category === 'insect_meal' && input.insect === null) throw badRequest('insect: an insect meal needs its insect, processing and rearing substrate', { insect: ['an insect meal needs its insect, processing and rearing substrate'] });
    if (category !== 'insect_meal' && input.insect) throw badRequest('insect: only insect meals carry insect details', { insect: ['only insect meals carry insect details'] });
    const insect = input.insect !== undefined ? insectColumns({ category, insect: input.insect }) : category === 'insect_meal' ? {} : insectColumns({ category });
    await t
      .update(ingredients)
      .set({ name: input.name ?? row.name, category, notes: input.notes === undefined ? row.notes : input.notes, ...insect, version: row.version + 1 })
      .where(eq(ingredients.id, id));
    if (input.values) {
      const current = new Map((await t.select().from(ingredientNutrientValues).where(eq(ingredientNutrientValues.ingredientId, id))).map((v) => [v.nutrientId, v.value]));
      const removed = Object.entries(input.values).filter(([k, v]) => v === null && current.has(k)).map(([k]) => k);
      const changed = Object.fromEntries(Object.entries(input.values).filter((e): e is [string, number] => e[1] !== null && current.get(e[0]) !== e[1]));
      if (Object.keys(changed).length > 0 && !input.source) throw badRequest('source: say where the changed values come from', { source: ['say where the changed values come from'] });
      if (removed.length) await t.delete(ingredientNutrientValues).where(and(eq(ingredientNutrientValues.ingredientId, id), inArray(ingredientNutrientValues.nutrientId, removed)));
      if (input.source) await insertValueSet(t, id, input.source, changed);
      await dropEmptyValueSets(t, id);
    }
  });
}

/** Names in a message: the first few in quotes, then how many more. */
function nameList(names: string[], most = 5): string {
  const quoted = names.slice(0, most).map((n) => `“${n}”`);
  const more = names.length > most ? ` and ${names.length - most} more` : '';
  return `${quoted.join(', ')}${more}`;
}

/**
 * What still uses an ingredient: formulas whose current inputs choose it, specifications that cap its
 * inclusion, supply plans that take their meal's values from it. Kept formula versions are not uses:
 * each holds its own copy of the values and prices it was solved with.
 */
async function usesOf(tx: Db, organizationId: number, id: number) {
  const formulaRows = await tx.select({ id: formulas.id, name: formulas.name, inputs: formulas.inputs }).from(formulas).where(eq(formulas.organizationId, organizationId)).orderBy(asc(formulas.name));
  const capRows = await tx
    .selectDistinct({ id: specifications.id, name: specifications.name })
    .from(specificationCaps)
    .innerJoin(specifications, eq(specifications.id, specificationCaps.specificationId))
    .where(and(eq(specificationCaps.ingredientId, id), eq(specifications.organizationId, organizationId)))
    .orderBy(asc(specifications.name));
  const planRows = await tx.select({ id: supplyPlans.id, name: supplyPlans.name }).from(supplyPlans).where(and(eq(supplyPlans.organizationId, organizationId), eq(supplyPlans.mealIngredientId, id))).orderBy(asc(supplyPlans.name));
  return {
    formulas: formulaRows.filter((f) => f.inputs.ingredients.some((i) => i.ingredientId === id)).map((f) => f.name),
    specifications: capRows.map((c) => c.name),
    supplyPlans: planRows.map((p) => p.name),
  };
}

/**
 * Deletes an ingredient of the organization's own library with its values, prices and analysis history.
 * Refused (409 `in_use`, naming each use) while a formula, a specification's inclusion limit or a supply
 * plan still uses it, so nothing that uses it changes silently; kept formula versions never stop it.
 */
export async function deleteIngredient(db: Db, organizationId: number, id: number): Promise<void> {
  await db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const row = await lockOwnIngredient(t, organizationId, id);
    const uses = await usesOf(t, organizationId, id);
    const parts: string[] = [];
    if (uses.formulas.length) parts.push(`the formula${uses.formulas.length > 1 ? 's' : ''} ${nameList(uses.formulas)} (take it out of ${uses.formulas.length > 1 ? 'each' : 'it'})`);
    if (uses.specifications.length) parts.push(`the inclusion limits of the specification${uses.specifications.length > 1 ? 's' : ''} ${nameList(uses.specifications)} (remove the limit)`);
    if (uses.supplyPlans.length) parts.push(`the supply plan${uses.supplyPlans.length > 1 ? 's' : ''} ${nameList(uses.supplyPlans)} (choose another meal entry)`);
    if (parts.length) {
      const fieldErrors: Record<string, string[]> = {};
      if (uses.formulas.length) fieldErrors.formulas = uses.formulas;
      if (uses.specifications.length) fieldErrors.specifications = uses.specifications;
      if (uses.supplyPlans.length) fieldErrors.supplyPlans = uses.supplyPlans;
      throw new HttpError(409, 'in_use', `“${row.name}” was not deleted: it is used in ${parts.join('; and in ')}. Formula versions already kept are not in the way: each keeps its own copy of the values it was solved with.`, fieldErrors);
    }
    await t.delete(ingredients).where(eq(ingredients.id, id));
  });
}

/** Copies a visible ingredient (usually from the reference library) into the organization's own library. */
export async function copyIngredient(db: Db, organizationId: number, id: number, name?: string): Promise<number> {
  await findVisibleIngredient(db, organizationId, id);
  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const newId = (await copyIngredientsToOrganization(t, organizationId, [id])).get(id)!;
    if (name) await t.update(ingredients).set({ name }).where(eq(ingredients.id, newId));
    return newId;
  });
}

/**
 * Copies every reference ingredient the organization has not copied yet into its own library (how a
 * new organization starts). Returns how many were copied.
 */
export async function copyReferenceLibrary(db: Db, organizationId: number): Promise<number> {
  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const copied = await t.select({ from: ingredients.copiedFromId }).from(ingredients).where(eq(ingredients.organizationId, organizationId));
    const have = new Set(copied.map((c) => c.from));
    const reference = await t.select({ id: ingredients.id }).from(ingredients).where(isNull(ingredients.organizationId));
    const missing = reference.map((r) => r.id).filter((id) => !have.has(id));
    if (missing.length === 0) return 0;
    return (await copyIngredientsToOrganization(t, organizationId, missing)).size;
  });
}

/** How sure an analysis value is, in the library's terms: measured and calculated are the lab's; estimates name their method. */
const confidenceOf = (v: LabValue): 'verified' | 'derived' | 'from_memory' =>
  v.origin === 'measured' || v.origin === 'calculated' ? 'verified' : v.origin === 'override' ? 'from_memory' : v.method?.confidence === 'from_memory' ? 'from_memory' : 'derived';

const roundValue = (v: number) => Math.round(v * 1e6) / 1e6;

/** A lab analysis ready to go into the library: its values as fed at its own dry matter. */
export type AnalysisToApply = {
  /** Names the analysis on each value set it writes, e.g. "Wend Feed Lab, sample OH-0312 (march.csv)". */
  sourceName: string;
  analysedOn: string;
  dryMatterPct: number;
  values: LabValue[];
};

/**
 * The one way a lab analysis (imported or typed in) changes an ingredient of the organization's own
 * library, inside the caller's transaction:
 * - value by value, it replaces the library's value of each nutrient it gives; the others stay;
 * - a value the library holds from a later-dated analysis (or an estimate made from one) is kept, so a
 *   report filed late never hides a newer one; on the same date the analysis recorded last wins;
 * - measured and calculated values form one lab value set (the analysis's name, date and dry matter,
 *   confidence verified); each estimation method's values form their own set naming the method, and
 *   values entered over an estimate theirs;
 * - the ingredient's version rises once.
 * Values are rounded to 1e-6 of their unit. Returns the nutrients applied and those kept.
 */
export async function applyLabAnalysis(tx: Db, organizationId: number, id: number, analysis: AnalysisToApply): Promise<{ applied: string[]; kept: KeptValue[] }> {
  await checkNutrientValues(tx, Object.fromEntries(analysis.values.map((v) => [v.nutrientId, roundValue(v.asFed)])));
  const row = await lockOwnIngredient(tx, organizationId, id);
  const held = new Map(
    (
      await tx
        .select({ nutrientId: ingredientNutrientValues.nutrientId, analysedOn: ingredientValueSets.analysedOn })
        .from(ingredientNutrientValues)
        .innerJoin(ingredientValueSets, eq(ingredientValueSets.id, ingredientNutrientValues.valueSetId))
        .where(eq(ingredientNutrientValues.ingredientId, id))
    ).map((h) => [h.nutrientId, h.analysedOn]),
  );
  const applied: LabValue[] = [];
  const kept: KeptValue[] = [];
  for (const v of analysis.values) {
    const since = held.get(v.nutrientId);
    if (since && since > analysis.analysedOn) kept.push({ nutrientId: v.nutrientId, heldSince: since });
    else applied.push(v);
  }
  const groups = new Map<string, { name: string; kind: 'lab' | 'estimate'; confidence: 'verified' | 'derived' | 'from_memory'; values: Record<string, number> }>();
  for (const v of applied) {
    const key = v.origin === 'measured' || v.origin === 'calculated' ? 'lab' : v.origin === 'override' ? 'override' : `estimate:${v.method?.id ?? 'unnamed'}`;
    const name =
      key === 'lab' ? analysis.sourceName : v.origin === 'override' ? `Entered over the estimate when importing ${analysis.sourceName}` : `Estimated: ${v.method?.name ?? 'an equation'}, from ${analysis.sourceName}`;
    const group = groups.get(key) ?? { name: name.slice(0, 300), kind: key === 'lab' ? 'lab' : 'estimate', confidence: confidenceOf(v), values: {} };
    group.values[v.nutrientId] = roundValue(v.asFed);
    groups.set(key, group);
  }
  for (const g of groups.values()) {
    await insertValueSet(tx, id, { kind: g.kind, name: g.name, confidence: g.confidence, analysedOn: analysis.analysedOn, dryMatterPct: analysis.dryMatterPct }, g.values);
  }
  await dropEmptyValueSets(tx, id);
  await tx.update(ingredients).set({ version: row.version + 1 }).where(eq(ingredients.id, id));
  return { applied: applied.map((v) => v.nutrientId), kept };
}
