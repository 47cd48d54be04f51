/**
 * Writes the reference library (nutrients, ingredients, species, phases, specifications) and copies it into
 * an organization's own library. Callers run these inside one transaction.
 */
import { and, eq, inArray, isNull } from 'drizzle-orm';

import { dryMatterToAsFed } from '../../../src/shared/units';
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
} from '../schema';
import { REFERENCE_INGREDIENTS } from './ingredients';
import { NUTRIENT_CATALOGUE } from './nutrients';
import { REFERENCE_PHASES, REFERENCE_SPECIES, REFERENCE_SPECIFICATIONS } from './requirements';

/** Rounds away floating-point dust from a unit conversion (values keep 6 significant decimals). */
const tidy = (value: number) => Math.round(value * 1e6) / 1e6;

export async function seedReferenceLibrary(tx: Db): Promise<void> {
  await tx.insert(nutrients).values(NUTRIENT_CATALOGUE);

  for (const item of REFERENCE_INGREDIENTS) {
    const [{ id }] = await tx
      .insert(ingredients)
      .values({
        organizationId: null,
        code: item.code,
        name: item.name,
        category: item.category,
        notes: item.notes ?? null,
        insectSpecies: item.insect?.species ?? null,
        insectProcessing: item.insect?.processing ?? null,
        substrate: item.insect?.substrate ?? null,
        substrateOrigin: item.insect?.origin ?? null,
        substrateAnimals: item.insect ? (item.insect.animals ?? []) : null,
      })
      .$returningId();
    for (const set of item.valueSets) {
      const [{ id: valueSetId }] = await tx
        .insert(ingredientValueSets)
        .values({ ingredientId: id, sourceKind: set.sourceKind, sourceName: set.sourceName, confidence: set.confidence, dryMatterPct: set.dryMatterPct, note: set.note ?? null })
        .$returningId();
      const rows = Object.entries(set.values).map(([nutrientId, value]) => ({
        ingredientId: id,
        nutrientId,
        valueSetId,
        value: set.publishedBasis === 'dry_matter' ? tidy(dryMatterToAsFed(value, set.dryMatterPct)) : value,
      }));
      if (rows.length > 0) await tx.insert(ingredientNutrientValues).values(rows);
    }
  }

  const speciesIds = new Map<string, number>();
  for (const s of REFERENCE_SPECIES) {
    const [{ id }] = await tx.insert(species).values({ organizationId: null, ...s }).$returningId();
    speciesIds.set(s.code, id);
  }
  const phaseIds = new Map<string, number>();
  for (const { code, speciesCode, ...p } of REFERENCE_PHASES) {
    const [{ id }] = await tx.insert(phases).values({ ...p, organizationId: null, speciesId: speciesIds.get(speciesCode)! }).$returningId();
    phaseIds.set(code, id);
  }
  for (const spec of REFERENCE_SPECIFICATIONS) {
    const [{ id }] = await tx
      .insert(specifications)
      .values({
        organizationId: null,
        code: spec.code,
        speciesId: speciesIds.get(spec.speciesCode)!,
        phaseId: phaseIds.get(spec.phaseCode)!,
        name: spec.name,
        source: spec.source,
        notes: spec.notes ?? null,
        feedIntakeGPerDay: spec.feedIntakeGPerDay ?? null,
      })
      .$returningId();
    await tx.insert(specificationNutrients).values(spec.bounds.map((b) => ({ specificationId: id, nutrientId: b.nutrientId, min: b.min ?? null, max: b.max ?? null, confidence: b.confidence, note: b.note ?? null })));
    if (spec.ratios?.length) await tx.insert(specificationRatios).values(spec.ratios.map((r) => ({ specificationId: id, ...r, min: r.min ?? null, max: r.max ?? null })));
    if (spec.caps?.length) {
      await tx.insert(specificationCaps).values(
        spec.caps.map((c) => ({ specificationId: id, scope: c.scope, category: c.category ?? null, insectSpecies: c.insectSpecies ?? null, maxPct: c.maxPct, soft: true, source: c.source, note: c.note ?? null })),
      );
    }
  }
}

/**
 * Copies ingredients (with their value sets and values, without prices) into an organization's library.
 * Returns source id → new id. `sourceIds` omitted: the whole reference library.
 */
export async function copyIngredientsToOrganization(tx: Db, organizationId: number, sourceIds?: number[]): Promise<Map<number, number>> {
  const sources = await tx
    .select()
    .from(ingredients)
    .where(sourceIds ? inArray(ingredients.id, sourceIds.length ? sourceIds : [-1]) : isNull(ingredients.organizationId));
  const map = new Map<number, number>();
  if (sources.length === 0) return map;
  const sets = await tx.select().from(ingredientValueSets).where(inArray(ingredientValueSets.ingredientId, sources.map((s) => s.id)));
  const values = await tx.select().from(ingredientNutrientValues).where(inArray(ingredientNutrientValues.ingredientId, sources.map((s) => s.id)));
  for (const source of sources) {
    const { id: _id, organizationId: _org, code: _code, copiedFromId: _copied, version: _v, createdAt: _c, updatedAt: _u, pricePerKg: _p, priceDate: _d, ...rest } = source;
    const [{ id }] = await tx.insert(ingredients).values({ ...rest, organizationId, copiedFromId: source.id }).$returningId();
    map.set(source.id, id);
    for (const set of sets.filter((s) => s.ingredientId === source.id)) {
      const { id: setId, ingredientId: _i, createdAt: _sc, ...setRest } = set;
      const [{ id: newSetId }] = await tx.insert(ingredientValueSets).values({ ...setRest, ingredientId: id }).$returningId();
      const rows = values.filter((v) => v.valueSetId === setId).map((v) => ({ ...v, ingredientId: id, valueSetId: newSetId }));
      if (rows.length) await tx.insert(ingredientNutrientValues).values(rows);
    }
  }
  return map;
}

/** Copies one specification (bounds, ratios, caps) into an organization's library; returns the new id. */
export async function copySpecificationToOrganization(tx: Db, organizationId: number, sourceId: number, name?: string): Promise<number> {
  const [source] = await tx.select().from(specifications).where(eq(specifications.id, sourceId));
  const { id: _id, organizationId: _o, code: _code, copiedFromId: _c, version: _v, createdAt: _ca, updatedAt: _ua, ...rest } = source;
  const [{ id }] = await tx.insert(specifications).values({ ...rest, name: name ?? rest.name, organizationId, copiedFromId: sourceId }).$returningId();
  const bounds = await tx.select().from(specificationNutrients).where(eq(specificationNutrients.specificationId, sourceId));
  if (bounds.length) await tx.insert(specificationNutrients).values(bounds.map(({ id: _b, ...b }) => ({ ...b, specificationId: id })));
  const ratios = await tx.select().from(specificationRatios).where(eq(specificationRatios.specificationId, sourceId));
  if (ratios.length) await tx.insert(specificationRatios).values(ratios.map(({ id: _r, ...r }) => ({ ...r, specificationId: id })));
  const caps = await tx.select().from(specificationCaps).where(eq(specificationCaps.specificationId, sourceId));
  if (caps.length) await tx.insert(specificationCaps).values(caps.map(({ id: _k, ...k }) => ({ ...k, specificationId: id })));
  return id;
}

/** Ids of reference specifications by code. */
export async function referenceSpecificationIds(tx: Db, codes: string[]): Promise<Map<string, number>> {
  const rows = await tx.select({ id: specifications.id, code: specifications.code }).from(specifications).where(and(isNull(specifications.organizationId), inArray(specifications.code, codes)));
  return new Map(rows.map((r) => [r.code!, r.id]));
}
