import { and, asc, count, eq, inArray, isNull, like, or, sql, type SQL } from 'drizzle-orm';
import type { z } from 'zod';

import type { Page } from '../../../src/shared/schemas/library-common';
import type { createPhaseInput, createSpeciesInput, listSpeciesQuery, Phase, Species } from '../../../src/shared/schemas/specifications';
import { HttpError, notFound } from '../../http/errors';
import type { Db } from '../client';
import { organizations, phases, species, type PhaseRow, type SpeciesRow } from '../schema';
import { likePattern } from './library-shared';

const speciesVisible = (organizationId: number) => or(isNull(species.organizationId), eq(species.organizationId, organizationId));
const phasesVisible = (organizationId: number) => or(isNull(phases.organizationId), eq(phases.organizationId, organizationId));

const toPhase = (p: PhaseRow): Phase => ({
  id: p.id,
  speciesId: p.speciesId,
  library: p.organizationId === null ? 'reference' : 'own',
  name: p.name,
  span: p.span,
  ageFromDays: p.ageFromDays,
  ageToDays: p.ageToDays,
  bodyWeightFromKg: p.bodyWeightFromKg,
  bodyWeightToKg: p.bodyWeightToKg,
});

async function withPhases(db: Db, organizationId: number, rows: SpeciesRow[]): Promise<Species[]> {
  const all = rows.length ? await db.select().from(phases).where(and(inArray(phases.speciesId, rows.map((r) => r.id)), phasesVisible(organizationId))).orderBy(asc(phases.sortOrder), asc(phases.id)) : [];
  return rows.map((s) => ({ id: s.id, library: s.organizationId === null ? 'reference' : 'own', code: s.code, name: s.name, family: s.family, phases: all.filter((p) => p.speciesId === s.id).map(toPhase) }));
}

export async function listSpecies(db: Db, organizationId: number, q: z.output<typeof listSpeciesQuery>): Promise<Page<Species>> {
  const where: SQL[] = [speciesVisible(organizationId)!];
  if (q.family) where.push(eq(species.family, q.family));
  if (q.search) where.push(like(species.name, likePattern(q.search)));
  const filter = and(...where);
  const [{ total }] = await db.select({ total: count() }).from(species).where(filter);
  const rows = await db.select().from(species).where(filter).orderBy(asc(species.sortOrder), asc(species.id)).limit(q.pageSize).offset((q.page - 1) * q.pageSize);
  return { items: await withPhases(db, organizationId, rows), total, page: q.page, pageSize: q.pageSize };
}

export async function findVisibleSpecies(db: Db, organizationId: number, id: number): Promise<SpeciesRow> {
  const [row] = await db.select().from(species).where(and(eq(species.id, id), speciesVisible(organizationId)));
  if (!row) throw notFound('species', id);
  return row;
}

export async function getSpecies(db: Db, organizationId: number, id: number): Promise<Species> {
  return (await withPhases(db, organizationId, [await findVisibleSpecies(db, organizationId, id)]))[0];
}

export async function findVisiblePhase(db: Db, organizationId: number, id: number): Promise<PhaseRow> {
  const [row] = await db.select().from(phases).where(and(eq(phases.id, id), phasesVisible(organizationId)));
  if (!row) throw notFound('phase', id);
  return row;
}

/** Same name, ignoring case and surrounding spaces (names are trimmed on input). */
const sameName = (column: typeof species.name | typeof phases.name, name: string) => sql`lower(${column}) = ${name.toLowerCase()}`;

/**
 * Holds the organization's row until the transaction ends, so two people adding the same name at the
 * same moment are served one after the other and the second hears it is taken.
 */
async function lockOrganization(tx: Db, organizationId: number): Promise<void> {
  await tx.select({ id: organizations.id }).from(organizations).where(eq(organizations.id, organizationId)).for('update');
}

const duplicate = (message: string) => new HttpError(409, 'duplicate_name', message, { name: [message] });

/** Adds a species of the organization; a name already in the list (reference or own) answers 409. */
export async function createSpecies(db: Db, organizationId: number, input: z.output<typeof createSpeciesInput>): Promise<number> {
  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    await lockOrganization(t, organizationId);
    const [taken] = await t.select().from(species).where(and(speciesVisible(organizationId), sameName(species.name, input.name)));
    if (taken) {
      throw duplicate(`A species named “${taken.name}” is already in the ${taken.organizationId === null ? 'reference list' : 'list of your species'}: choose another name, or add a phase to it.`);
    }
    const code = input.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'species';
    const [{ id }] = await t.insert(species).values({ organizationId, code, name: input.name, family: input.family, sortOrder: 1000 }).$returningId();
    return id;
  });
}

/**
 * Adds a phase to a visible species; the phase belongs to the organization even on a reference species.
 * A phase name the species already has (reference or own) answers 409.
 */
export async function createPhase(db: Db, organizationId: number, speciesId: number, input: z.output<typeof createPhaseInput>): Promise<number> {
  const owner = await findVisibleSpecies(db, organizationId, speciesId);
  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    await lockOrganization(t, organizationId);
    const [taken] = await t.select().from(phases).where(and(eq(phases.speciesId, speciesId), phasesVisible(organizationId), sameName(phases.name, input.name)));
    if (taken) {
      throw duplicate(`${owner.name} already has a phase named “${taken.name}”${taken.span ? ` (${taken.span})` : ''}: choose another name.`);
    }
    const [{ id }] = await t
      .insert(phases)
      .values({
        speciesId,
        organizationId,
        name: input.name,
        span: input.span || null,
        ageFromDays: input.ageFromDays ?? null,
        ageToDays: input.ageToDays ?? null,
        bodyWeightFromKg: input.bodyWeightFromKg ?? null,
        bodyWeightToKg: input.bodyWeightToKg ?? null,
        sortOrder: 1000,
      })
      .$returningId();
    return id;
  });
}
