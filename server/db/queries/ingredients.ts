import { and, asc, count, desc, eq, inArray, isNull, like, or, sql, type SQL } from 'drizzle-orm';

import { checkInsectSubstrate, refusedFamilies } from '../../../src/shared/insect-rule';
import type { OriginAnimal } from '../../../src/shared/library-terms';
import type { z } from 'zod';

import type {
  createIngredientInput,
  IngredientDetail,
  IngredientSummary,
  InsectDetails,
  labAnalysisInput,
  ListIngredientsQuery,
  updateIngredientInput,
} from '../../../src/shared/schemas/ingredients';
import type { Page } from '../../../src/shared/schemas/library-common';
import { dryMatterToAsFed } from '../../../src/shared/units';
import { badRequest, notFound } from '../../http/errors';
import type { Db } from '../client';
import { copyIngredientsToOrganization } from '../reference-data/seed-library';
import { ingredientNutrientValues, ingredientPrices, ingredients, ingredientValueSets, species, priceColumn, type IngredientRow } from '../schema';
import { checkNutrientValues, likePattern, readOnlyReference, toNumber, today, versionConflict } from './library-shared';

type CreateInput = z.output<typeof createIngredientInput>;
type UpdateInput = z.output<typeof updateIngredientInput>;
type LabInput = z.output<typeof labAnalysisInput>;

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

export async function deleteIngredient(db: Db, organizationId: number, id: number): Promise<void> {
  await db.transaction(async (tx) => {
    await lockOwnIngredient(tx as unknown as Db, organizationId, id);
    await tx.delete(ingredients).where(eq(ingredients.id, id));
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

/** Records a dated lab analysis: the values it measured replace the current ones, as fed. */
export async function addLabAnalysis(db: Db, organizationId: number, id: number, input: LabInput): Promise<void> {
  await checkNutrientValues(db, input.values);
  await db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const row = await lockOwnIngredient(t, organizationId, id);
    const asFed = Object.fromEntries(
      Object.entries(input.values).map(([k, v]) => [k, input.basis === 'dry_matter' && k !== 'dm' ? Math.round(dryMatterToAsFed(v, input.dryMatterPct) * 1e6) / 1e6 : v]),
    );
    asFed.dm = input.dryMatterPct;
    await insertValueSet(t, id, { kind: 'lab', name: input.laboratory, confidence: 'verified', analysedOn: input.analysedOn, dryMatterPct: input.dryMatterPct }, asFed);
    await dropEmptyValueSets(t, id);
    await t.update(ingredients).set({ version: row.version + 1 }).where(eq(ingredients.id, id));
  });
}
