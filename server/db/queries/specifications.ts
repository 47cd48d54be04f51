import { and, asc, count, eq, inArray, isNull, like, or, sql, type SQL } from 'drizzle-orm';
import type { z } from 'zod';

import { checkInsectSubstrate } from '../../../src/shared/insect-rule';
import type { Page } from '../../../src/shared/schemas/library-common';
import type { SpeciesFamily } from '../../../src/shared/library-terms';
import type {
  copySpecificationInput,
  createSpecificationInput,
  listSpecificationsQuery,
  SpecificationDetail,
  SpecificationSummary,
  updateSpecificationInput,
} from '../../../src/shared/schemas/specifications';
import { badRequest, HttpError, notFound } from '../../http/errors';
import type { Db } from '../client';
import {
  ingredients,
  nutrients,
  phases,
  species,
  specificationCaps,
  specificationNutrients,
  specificationRatios,
  specifications,
  type PhaseRow,
  type SpeciesRow,
  type SpecificationRow,
} from '../schema';
import { likePattern, readOnlyReference, versionConflict } from './library-shared';

type SpecInput = z.output<typeof createSpecificationInput>;
type SpecUpdate = z.output<typeof updateSpecificationInput>;

const visibleTo = (organizationId: number) => or(isNull(specifications.organizationId), eq(specifications.organizationId, organizationId));

export async function listSpecifications(db: Db, organizationId: number, q: z.output<typeof listSpecificationsQuery>): Promise<Page<SpecificationSummary>> {
  const where: SQL[] = [q.library === 'reference' ? isNull(specifications.organizationId) : eq(specifications.organizationId, organizationId)];
  if (q.speciesId) where.push(eq(specifications.speciesId, q.speciesId));
  if (q.search) where.push(like(specifications.name, likePattern(q.search)));
  const filter = and(...where);
  const [{ total }] = await db.select({ total: count() }).from(specifications).where(filter);
  const rows = await db
    .select({ spec: specifications, species, phase: phases })
    .from(specifications)
    .innerJoin(species, eq(species.id, specifications.speciesId))
    .leftJoin(phases, eq(phases.id, specifications.phaseId))
    .where(filter)
    .orderBy(asc(species.sortOrder), asc(phases.sortOrder), asc(specifications.name), asc(specifications.id))
    .limit(q.pageSize)
    .offset((q.page - 1) * q.pageSize);
  const ids = rows.map((r) => r.spec.id);
  const counts = ids.length
    ? await db.select({ id: specificationNutrients.specificationId, n: count() }).from(specificationNutrients).where(inArray(specificationNutrients.specificationId, ids)).groupBy(specificationNutrients.specificationId)
    : [];
  const countOf = new Map(counts.map((c) => [c.id, c.n]));
  return {
    items: rows.map((r) => summary(r.spec, r.species, r.phase, countOf.get(r.spec.id) ?? 0)),
    total,
    page: q.page,
    pageSize: q.pageSize,
  };
}

function summary(spec: SpecificationRow, s: typeof species.$inferSelect, phase: typeof phases.$inferSelect | null, boundCount: number): SpecificationSummary {
  return {
    id: spec.id,
    library: spec.organizationId === null ? 'reference' : 'own',
    name: spec.name,
    source: spec.source,
    species: { id: s.id, name: s.name, family: s.family },
    phase: phase ? { id: phase.id, name: phase.name, span: phase.span } : null,
    boundCount,
    version: spec.version,
  };
}

async function findVisible(db: Db, organizationId: number, id: number): Promise<SpecificationRow> {
  const [row] = await db.select().from(specifications).where(and(eq(specifications.id, id), visibleTo(organizationId)));
  if (!row) throw notFound('specification', id);
  return row;
}

export async function getSpecification(db: Db, organizationId: number, id: number): Promise<SpecificationDetail> {
  const spec = await findVisible(db, organizationId, id);
  const [s] = await db.select().from(species).where(eq(species.id, spec.speciesId));
  const [phase] = spec.phaseId ? await db.select().from(phases).where(eq(phases.id, spec.phaseId)) : [null];
  const bounds = await db.select().from(specificationNutrients).where(eq(specificationNutrients.specificationId, id)).orderBy(asc(specificationNutrients.id));
  const ratios = await db.select().from(specificationRatios).where(eq(specificationRatios.specificationId, id)).orderBy(asc(specificationRatios.id));
  const caps = await db
    .select({ cap: specificationCaps, ingredientName: ingredients.name })
    .from(specificationCaps)
    .leftJoin(ingredients, eq(ingredients.id, specificationCaps.ingredientId))
    .where(eq(specificationCaps.specificationId, id))
    .orderBy(asc(specificationCaps.id));
  const meals = await db.select().from(ingredients).where(and(eq(ingredients.organizationId, organizationId), eq(ingredients.category, 'insect_meal')));
  const refusedIngredients = meals.flatMap((m) => {
    const verdict = checkInsectSubstrate(m, s.family, s.name);
    return verdict.allowed ? [] : [{ id: m.id, name: m.name, message: verdict.message }];
  });
  return {
    ...summary(spec, s, phase ?? null, bounds.length),
    notes: spec.notes,
    feedIntakeGPerDay: spec.feedIntakeGPerDay,
    copiedFromId: spec.copiedFromId,
    bounds: bounds.map((b) => ({ nutrientId: b.nutrientId, min: b.min, max: b.max, confidence: b.confidence, note: b.note })),
    ratios: ratios.map((r) => ({ numeratorId: r.numeratorId, denominatorId: r.denominatorId, min: r.min, max: r.max, confidence: r.confidence, note: r.note })),
    caps: caps.map(({ cap, ingredientName }) => ({
      scope: cap.scope,
      ingredientId: cap.ingredientId,
      ingredientName,
      category: cap.category,
      insectSpecies: cap.insectSpecies,
      minPct: cap.minPct,
      maxPct: cap.maxPct,
      soft: cap.soft,
      source: cap.source,
      note: cap.note,
    })),
    refusedIngredients,
    updatedAt: spec.updatedAt.toISOString(),
  };
}

/** Checks every reference in a specification body; throws one 400 with a field error per problem. */
async function checkReferences(db: Db, organizationId: number, input: SpecInput): Promise<void> {
  const fieldErrors: Record<string, string[]> = {};
  const [s] = await db.select().from(species).where(and(eq(species.id, input.speciesId), or(isNull(species.organizationId), eq(species.organizationId, organizationId))));
  if (!s) fieldErrors.speciesId = [`no species with id ${input.speciesId}`];
  if (input.phaseId) {
    const [p] = await db.select().from(phases).where(and(eq(phases.id, input.phaseId), or(isNull(phases.organizationId), eq(phases.organizationId, organizationId))));
    if (!p || p.speciesId !== input.speciesId) fieldErrors.phaseId = [`no phase with id ${input.phaseId} for this species`];
  }
  const ids = [...new Set([...input.bounds.map((b) => b.nutrientId), ...input.ratios.flatMap((r) => [r.numeratorId, r.denominatorId])])];
  const known = new Map((ids.length ? await db.select().from(nutrients).where(inArray(nutrients.id, ids)) : []).map((n) => [n.id, n]));
  input.bounds.forEach((b, i) => {
    const n = known.get(b.nutrientId);
    if (!n) fieldErrors[`bounds[${i}].nutrientId`] = [`“${b.nutrientId}” is not a nutrient in the catalogue`];
    else if (s && !n.families.includes(s.family)) fieldErrors[`bounds[${i}].nutrientId`] = [`${n.name} is not used in ${s.family === 'swine' ? 'pig' : 'poultry'} diets: use the nutrient on this species’ basis`];
  });
  input.ratios.forEach((r, i) => {
    if (!known.has(r.numeratorId)) fieldErrors[`ratios[${i}].numeratorId`] = [`“${r.numeratorId}” is not a nutrient in the catalogue`];
    if (!known.has(r.denominatorId)) fieldErrors[`ratios[${i}].denominatorId`] = [`“${r.denominatorId}” is not a nutrient in the catalogue`];
  });
  const capIngredientIds = input.caps.flatMap((c) => (c.scope === 'ingredient' && c.ingredientId ? [c.ingredientId] : []));
  const capIngredients = new Map(
    (capIngredientIds.length ? await db.select().from(ingredients).where(and(inArray(ingredients.id, capIngredientIds), eq(ingredients.organizationId, organizationId))) : []).map((r) => [r.id, r]),
  );
  input.caps.forEach((c, i) => {
    if (c.scope !== 'ingredient' || !c.ingredientId) return;
    const row = capIngredients.get(c.ingredientId);
    if (!row) fieldErrors[`caps[${i}].ingredientId`] = [`no ingredient with id ${c.ingredientId} in your library`];
    else if (s) {
      const verdict = checkInsectSubstrate(row, s.family, s.name);
      if (!verdict.allowed) fieldErrors[`caps[${i}].ingredientId`] = [verdict.message];
    }
  });
  const first = Object.entries(fieldErrors)[0];
  if (first) throw badRequest(`${first[0]}: ${first[1][0]}`, fieldErrors);
}

async function writeRows(tx: Db, specificationId: number, input: SpecInput) {
  if (input.bounds.length) await tx.insert(specificationNutrients).values(input.bounds.map((b) => ({ specificationId, nutrientId: b.nutrientId, min: b.min ?? null, max: b.max ?? null, note: b.note ?? null, confidence: null })));
  if (input.ratios.length) await tx.insert(specificationRatios).values(input.ratios.map((r) => ({ specificationId, numeratorId: r.numeratorId, denominatorId: r.denominatorId, min: r.min ?? null, max: r.max ?? null, note: r.note ?? null, confidence: null })));
  if (input.caps.length) {
    await tx.insert(specificationCaps).values(
      input.caps.map((c) => ({
        specificationId,
        scope: c.scope,
        ingredientId: c.scope === 'ingredient' ? (c.ingredientId ?? null) : null,
        category: c.scope === 'category' ? (c.category ?? null) : null,
        insectSpecies: c.scope === 'insect_species' ? (c.insectSpecies ?? null) : null,
        minPct: c.minPct ?? null,
        maxPct: c.maxPct ?? null,
        soft: c.soft,
        source: c.source,
        note: c.note ?? null,
      })),
    );
  }
}

export async function createSpecification(db: Db, organizationId: number, input: SpecInput): Promise<number> {
  await checkReferences(db, organizationId, input);
  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const [{ id }] = await t
      .insert(specifications)
      .values({ organizationId, speciesId: input.speciesId, phaseId: input.phaseId ?? null, name: input.name, source: input.source, notes: input.notes ?? null, feedIntakeGPerDay: input.feedIntakeGPerDay ?? null })
      .$returningId();
    await writeRows(t, id, input);
    return id;
  });
}

/**
 * Replaces a specification of the organization. Bounds that keep their value keep their recorded
 * confidence; changed or new ones are the organization's own.
 */
export async function updateSpecification(db: Db, organizationId: number, id: number, input: SpecUpdate): Promise<void> {
  await checkReferences(db, organizationId, input);
  await db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const [row] = await t.select().from(specifications).where(and(eq(specifications.id, id), visibleTo(organizationId))).for('update');
    if (!row) throw notFound('specification', id);
    if (row.organizationId === null) throw readOnlyReference('specification');
    if (input.expectedVersion !== undefined && input.expectedVersion !== row.version) throw versionConflict('specification', row.version);
    const before = new Map((await t.select().from(specificationNutrients).where(eq(specificationNutrients.specificationId, id))).map((b) => [b.nutrientId, b]));
    await t
      .update(specifications)
      .set({ speciesId: input.speciesId, phaseId: input.phaseId ?? null, name: input.name, source: input.source, notes: input.notes ?? null, feedIntakeGPerDay: input.feedIntakeGPerDay ?? null, version: row.version + 1 })
      .where(eq(specifications.id, id));
    await t.delete(specificationNutrients).where(eq(specificationNutrients.specificationId, id));
    await t.delete(specificationRatios).where(eq(specificationRatios.specificationId, id));
    await t.delete(specificationCaps).where(eq(specificationCaps.specificationId, id));
    await writeRows(t, id, input);
    for (const b of input.bounds) {
      const old = before.get(b.nutrientId);
      if (old && old.confidence && old.min === (b.min ?? null) && old.max === (b.max ?? null)) {
        await t.update(specificationNutrients).set({ confidence: old.confidence }).where(and(eq(specificationNutrients.specificationId, id), eq(specificationNutrients.nutrientId, b.nutrientId)));
      }
    }
  });
}

export async function deleteSpecification(db: Db, organizationId: number, id: number): Promise<void> {
  await db.transaction(async (tx) => {
    const [row] = await tx.select().from(specifications).where(and(eq(specifications.id, id), visibleTo(organizationId))).for('update');
    if (!row) throw notFound('specification', id);
    if (row.organizationId === null) throw readOnlyReference('specification');
    await tx.delete(specifications).where(eq(specifications.id, id));
  });
}

const FAMILY_BASIS: Record<SpeciesFamily, string> = { poultry: 'poultry (AMEn, total or digestible amino acids)', swine: 'pig (NE, SID amino acids, STTD phosphorus)' };

/** The phase a copy goes into, with its species; a phase the organization cannot see is a 400 on `phaseId`. */
async function targetPhase(tx: Db, organizationId: number, phaseId: number): Promise<{ phase: PhaseRow; species: SpeciesRow }> {
  const visiblePhase = or(isNull(phases.organizationId), eq(phases.organizationId, organizationId));
  const visibleSpecies = or(isNull(species.organizationId), eq(species.organizationId, organizationId));
  const [row] = await tx.select({ phase: phases, species }).from(phases).innerJoin(species, eq(species.id, phases.speciesId)).where(and(eq(phases.id, phaseId), visiblePhase, visibleSpecies));
  if (!row) {
    const message = `No phase with id ${phaseId} among the reference species and your organization’s own: choose a phase from the list.`;
    throw badRequest(message, { phaseId: [message] });
  }
  return row;
}

/**
 * Copies a visible specification into the organization: every nutrient bound, ratio and cap (with
 * their confidence, notes and cited studies) in one transaction, recording the source in `copiedFromId`.
 * With `phaseId` the copy goes into that phase, which may belong to another species of the same family;
 * a pig phase for a poultry specification (or the reverse) is refused, since their nutrient bases differ.
 * A string in place of the input is the copy's name.
 */
export async function copySpecification(db: Db, organizationId: number, id: number, nameOrInput: string | z.output<typeof copySpecificationInput> = {}): Promise<number> {
  const input = typeof nameOrInput === 'string' ? { name: nameOrInput } : nameOrInput;
  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    // A shared lock waits for a save in progress, so the copy never mixes rows from before and after it
    // (MariaDB spells it LOCK IN SHARE MODE; it has no FOR SHARE).
    await t.execute(sql`select ${specifications.id} from ${specifications} where ${specifications.id} = ${id} lock in share mode`);
    const [source] = await t.select().from(specifications).where(and(eq(specifications.id, id), visibleTo(organizationId)));
    if (!source) throw notFound('specification', id);
    let speciesId = source.speciesId;
    let phaseId = source.phaseId;
    let name = input.name ?? source.name;
    let notes = source.notes;
    if (input.phaseId != null && input.phaseId !== source.phaseId) {
      const target = await targetPhase(t, organizationId, input.phaseId);
      const [from] = await t.select().from(species).where(eq(species.id, source.speciesId));
      if (from.family !== target.species.family) {
        const message =
          `“${source.name}” is a ${FAMILY_BASIS[from.family]} specification and ${target.species.name} is ${from.family === 'poultry' ? 'a pig species' : 'a poultry species'}: ` +
          `its bounds would be on the wrong basis. Copy a ${target.species.family === 'swine' ? 'pig' : 'poultry'} specification into this phase, or start an empty one.`;
        throw new HttpError(400, 'family_mismatch', message, { phaseId: [message] });
      }
      const [fromPhase] = source.phaseId ? await t.select().from(phases).where(eq(phases.id, source.phaseId)) : [null];
      const wasFor = [from.name, fromPhase ? `${fromPhase.name}${fromPhase.span ? `, ${fromPhase.span}` : ''}` : null].filter(Boolean).join(', ');
      const origin = `Copied from “${source.name}” (${wasFor}): its bounds were set for that phase. Check each one for ${target.species.name}, ${target.phase.name}${target.phase.span ? ` (${target.phase.span})` : ''}.`;
      notes = [origin, source.notes].filter(Boolean).join('\n\n').slice(0, 2000);
      speciesId = target.species.id;
      phaseId = target.phase.id;
      name = input.name ?? `${target.species.name}, ${target.phase.name} (from ${source.name})`.slice(0, 160);
    }
    const [{ id: copyId }] = await t
      .insert(specifications)
      .values({ organizationId, copiedFromId: source.id, speciesId, phaseId, name, source: source.source, notes, feedIntakeGPerDay: source.feedIntakeGPerDay })
      .$returningId();
    const bounds = await t.select().from(specificationNutrients).where(eq(specificationNutrients.specificationId, id)).orderBy(asc(specificationNutrients.id));
    if (bounds.length) await t.insert(specificationNutrients).values(bounds.map(({ id: _b, ...b }) => ({ ...b, specificationId: copyId })));
    const ratios = await t.select().from(specificationRatios).where(eq(specificationRatios.specificationId, id)).orderBy(asc(specificationRatios.id));
    if (ratios.length) await t.insert(specificationRatios).values(ratios.map(({ id: _r, ...r }) => ({ ...r, specificationId: copyId })));
    const caps = await t.select().from(specificationCaps).where(eq(specificationCaps.specificationId, id)).orderBy(asc(specificationCaps.id));
    if (caps.length) await t.insert(specificationCaps).values(caps.map(({ id: _k, ...k }) => ({ ...k, specificationId: copyId })));
    return copyId;
  });
}
