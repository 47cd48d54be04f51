import { and, asc, count, desc, eq, inArray, isNotNull, isNull, max, or, sql } from 'drizzle-orm';
import type { z } from 'zod';

import { priceSweep, solveFormula } from '../../../src/shared/engine';
import { buildFormulaProblem, capWarnings, compareSolves, ingredientKey, inputsFromSpecification, type LibraryIngredient } from '../../../src/shared/formula-problem';
import type { OriginAnimal } from '../../../src/shared/library-terms';
import type {
  ApprovalState,
  ApprovedFormula,
  createFormulaInput,
  FormulaChoices,
  FormulaDetail,
  FormulaInputs,
  IngredientChoice,
  FormulaPriceSweep,
  formulaPriceSweepInput,
  FormulaRemoval,
  FormulaSolve,
  FormulaSummary,
  NutrientInfo,
  updateFormulaInput,
  VersionComparison,
  VersionDetail,
  VersionSummary,
} from '../../../src/shared/schemas/formulas';
import { badRequest, HttpError, notFound } from '../../http/errors';
import type { Db } from '../client';
import {
  batchLogs,
  formulas,
  formulaVersions,
  ingredientNutrientValues,
  ingredients,
  nutrients,
  organizations,
  shares,
  species as speciesTable,
  specifications,
  users,
  type FormulaRow,
  type FormulaVersionRow,
} from '../schema';
import { listIngredients } from './ingredients';
import { getSpecification, listSpecifications } from './specifications';

type CreateInput = z.output<typeof createFormulaInput>;
type UpdateInput = z.output<typeof updateFormulaInput>;
type SweepInput = z.output<typeof formulaPriceSweepInput>;

// ---------------------------------------------------------------------------
// Library reads (read-only helpers over the library tables)
// ---------------------------------------------------------------------------

/**
 * The chosen ingredients this organization can see (own or reference), with every value per kg as fed.
 * With `lock` (inside a transaction that writes a formula's inputs) the ingredient rows are read with
 * FOR UPDATE: deleting an ingredient locks its row the same way before it looks for formulas using it,
 * so a save and a delete of the same ingredient run one after the other and the second sees the first.
 * (MariaDB has no FOR SHARE; the lock lasts only as long as the save's short transaction.)
 */
async function loadLibrary(db: Db, organizationId: number, ids: number[], lock = false): Promise<Map<number, LibraryIngredient>> {
  const out = new Map<number, LibraryIngredient>();
  if (ids.length === 0) return out;
  const query = db
    .select()
    .from(ingredients)
    .where(and(inArray(ingredients.id, ids), or(isNull(ingredients.organizationId), eq(ingredients.organizationId, organizationId))))
    .orderBy(asc(ingredients.id));
  const rows = lock ? await query.for('update') : await query;
  const values = rows.length ? await db.select().from(ingredientNutrientValues).where(inArray(ingredientNutrientValues.ingredientId, rows.map((r) => r.id))) : [];
  for (const r of rows) {
    out.set(r.id, {
      id: r.id,
      name: r.name,
      category: r.category,
      insectSpecies: r.insectSpecies,
      substrate: r.substrate,
      substrateOrigin: r.substrateOrigin,
      substrateAnimals: (r.substrateAnimals ?? null) as OriginAnimal[] | null,
      pricePerKg: r.pricePerKg === null ? null : Number(r.pricePerKg),
      priceDate: r.priceDate,
      version: r.version,
      values: {},
    });
  }
  for (const v of values) out.get(v.ingredientId)!.values[v.nutrientId] = v.value;
  return out;
}

async function loadNutrientInfo(db: Db): Promise<Map<string, NutrientInfo>> {
  const rows = await db.select({ id: nutrients.id, name: nutrients.name, unit: nutrients.unit }).from(nutrients);
  return new Map(rows.map((n) => [n.id, n]));
}

async function userName(db: Db, userId: string): Promise<string> {
  const [u] = await db.select({ name: users.name, email: users.email }).from(users).where(eq(users.id, userId));
  return u?.name || u?.email || 'unknown';
}

/**
 * What a new formula is built from: the organization's own specifications and ingredients (the
 * reference library is copied into an organization's own first). With a specification, each ingredient
 * says whether the insect-protein rule lets it into that species' diets.
 */
export async function formulaChoices(db: Db, organizationId: number, specificationId?: number): Promise<FormulaChoices> {
  const specs = await listSpecifications(db, organizationId, { library: 'own', page: 1, pageSize: 200 });
  let speciesId: number | undefined;
  if (specificationId) {
    const spec = specs.items.find((s) => s.id === specificationId);
    if (!spec) throw notFound('specification', specificationId);
    speciesId = spec.species.id;
  }
  const items: IngredientChoice[] = [];
  for (let page = 1; ; page++) {
    const batch = await listIngredients(db, organizationId, { library: 'own', page, pageSize: 200, speciesId });
    for (const i of batch.items) {
      items.push({ id: i.id, name: i.name, category: i.category, insectSpecies: i.insect?.species ?? null, pricePerKg: i.pricePerKg, priceDate: i.priceDate, offered: i.offered ?? { allowed: true, message: null } });
    }
    if (page * 200 >= batch.total) break;
  }
  return {
    specifications: specs.items.map((s) => ({ id: s.id, name: s.name, species: s.species, phase: s.phase ? { name: s.phase.name, span: s.phase.span } : null })),
    ingredients: items,
  };
}

// ---------------------------------------------------------------------------
// Formulas
// ---------------------------------------------------------------------------

async function findFormula(db: Db, organizationId: number, id: number): Promise<FormulaRow> {
  const [row] = await db.select().from(formulas).where(and(eq(formulas.id, id), eq(formulas.organizationId, organizationId)));
  if (!row) throw notFound('formula', id);
  return row;
}

const day = (d: Date) => d.toISOString().slice(0, 10);

/**
 * An archived formula is read-only: changing, solving, keeping and approving answer 409 `archived`
 * until it is restored. Checked on the locked row wherever something is written, so an archive that
 * lands meanwhile is seen.
 */
async function refuseArchived(db: Db, row: { name: string; archivedAt: Date | null; archivedBy: string | null }): Promise<void> {
  if (!row.archivedAt) return;
  const who = row.archivedBy ? await userName(db, row.archivedBy) : 'someone';
  throw new HttpError(409, 'archived', `archived: restore it first. “${row.name}” was archived by ${who} on ${day(row.archivedAt)}; restore it to change, solve, keep or approve it.`);
}

/**
 * Whether a formula is archived, and since when and by whom, for the routes outside this module that hand its
 * versions on (recording a batch, sharing with a farm). Null when it is in use.
 */
export async function formulaArchival(db: Db, organizationId: number, formulaId: number): Promise<{ name: string; on: string; by: string } | null> {
  const [row] = await db.select({ name: formulas.name, archivedAt: formulas.archivedAt, archivedBy: formulas.archivedBy }).from(formulas).where(and(eq(formulas.id, formulaId), eq(formulas.organizationId, organizationId)));
  if (!row?.archivedAt) return null;
  return { name: row.name, on: day(row.archivedAt), by: row.archivedBy ? await userName(db, row.archivedBy) : 'someone' };
}

/** Versions of some formulas, with each approval marked current (the newest approval) or superseded. */
function summarizeVersions(rows: FormulaVersionRow[]): VersionSummary[] {
  const current = new Map<number, FormulaVersionRow>();
  for (const v of rows) {
    if (!v.approvedAt) continue;
    const best = current.get(v.formulaId);
    if (!best || v.approvedAt > best.approvedAt! || (v.approvedAt.getTime() === best.approvedAt!.getTime() && v.id > best.id)) current.set(v.formulaId, v);
  }
  return rows.map((v) => {
    const approval: ApprovalState = !v.approvedAt ? 'not_approved' : current.get(v.formulaId)?.id === v.id ? 'current' : 'superseded';
    return {
      id: v.id,
      formulaId: v.formulaId,
      number: v.number,
      status: v.status,
      costPerTonne: v.costPerTonne,
      note: v.note,
      createdBy: v.createdByName,
      createdAt: v.createdAt.toISOString(),
      approvedBy: v.approvedByName,
      approvedAt: v.approvedAt ? v.approvedAt.toISOString() : null,
      approval,
    };
  });
}

const versionColumns = {
  id: formulaVersions.id,
  formulaId: formulaVersions.formulaId,
  organizationId: formulaVersions.organizationId,
  number: formulaVersions.number,
  status: formulaVersions.status,
  costPerTonne: formulaVersions.costPerTonne,
  note: formulaVersions.note,
  createdByUserId: formulaVersions.createdByUserId,
  createdByName: formulaVersions.createdByName,
  createdAt: formulaVersions.createdAt,
  approvedByUserId: formulaVersions.approvedByUserId,
  approvedByName: formulaVersions.approvedByName,
  approvedAt: formulaVersions.approvedAt,
};

/** Version rows without their (large) snapshot. */
async function versionRows(db: Db, organizationId: number, formulaIds: number[]): Promise<FormulaVersionRow[]> {
  if (formulaIds.length === 0) return [];
  const rows = await db
    .select(versionColumns)
    .from(formulaVersions)
    .where(and(eq(formulaVersions.organizationId, organizationId), inArray(formulaVersions.formulaId, formulaIds)))
    .orderBy(desc(formulaVersions.number));
  return rows as FormulaVersionRow[];
}

async function summaries(db: Db, organizationId: number, rows: FormulaRow[]): Promise<(FormulaSummary & { versions: VersionSummary[] })[]> {
  const versions = summarizeVersions(await versionRows(db, organizationId, rows.map((r) => r.id)));
  const speciesIds = [...new Set(rows.map((r) => r.speciesId).filter((id): id is number => id !== null))];
  const speciesRows = speciesIds.length ? await db.select().from(speciesTable).where(inArray(speciesTable.id, speciesIds)) : [];
  const speciesById = new Map(speciesRows.map((s) => [s.id, s]));
  const specIds = [...new Set(rows.map((r) => r.specificationId).filter((id): id is number => id !== null))];
  const specRows = specIds.length ? await db.select({ id: specifications.id, name: specifications.name }).from(specifications).where(inArray(specifications.id, specIds)) : [];
  const specById = new Map(specRows.map((s) => [s.id, s]));
  const archiverIds = [...new Set(rows.map((r) => r.archivedBy).filter((id): id is string => id !== null))];
  const archivers = new Map((archiverIds.length ? await db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(inArray(users.id, archiverIds)) : []).map((u) => [u.id, u.name || u.email]));
  return rows.map((r) => {
    const own = versions.filter((v) => v.formulaId === r.id);
    const s = r.speciesId ? speciesById.get(r.speciesId) : undefined;
    return {
      id: r.id,
      name: r.name,
      species: s ? { id: s.id, name: s.name, family: s.family } : null,
      specification: r.specificationId && specById.has(r.specificationId) ? specById.get(r.specificationId)! : null,
      batchKg: r.inputs.batchKg,
      ingredientCount: r.inputs.ingredients.length,
      revision: r.revision,
      updatedAt: r.updatedAt.toISOString(),
      latestVersion: own[0] ?? null,
      approvedVersion: own.find((v) => v.approval === 'current') ?? null,
      archived: r.archivedAt ? { at: r.archivedAt.toISOString(), by: r.archivedBy ? (archivers.get(r.archivedBy) ?? null) : null } : null,
      versions: own,
    };
  });
}

/** The formulas in use, or with `archived` only the archived ones. */
export async function listFormulas(db: Db, organizationId: number, archived = false): Promise<FormulaSummary[]> {
  const rows = await db
    .select()
    .from(formulas)
    .where(and(eq(formulas.organizationId, organizationId), archived ? isNotNull(formulas.archivedAt) : isNull(formulas.archivedAt)))
    .orderBy(asc(formulas.name), asc(formulas.id));
  return (await summaries(db, organizationId, rows)).map(({ versions: _versions, ...s }) => s);
}

export async function getFormula(db: Db, organizationId: number, id: number): Promise<FormulaDetail> {
  const row = await findFormula(db, organizationId, id);
  const [summary] = await summaries(db, organizationId, [row]);
  const library = await loadLibrary(db, organizationId, row.inputs.ingredients.map((i) => i.ingredientId));
  const ingredientLabels = [...library.values()].map(({ id, name, category, insectSpecies, pricePerKg, priceDate }) => ({ id, name, category, insectSpecies, pricePerKg, priceDate }));
  return { ...summary, inputs: row.inputs, labels: { ingredients: ingredientLabels, nutrients: [...(await loadNutrientInfo(db)).values()] } };
}

/**
 * Checks what a formula's inputs name against the library: the same refusals a solve would give. Runs
 * inside the transaction that saves the inputs and locks the ingredient rows it reads (see loadLibrary),
 * so no ingredient can be deleted between this check and the save's commit.
 */
async function checkInputs(tx: Db, organizationId: number, inputs: FormulaInputs, speciesOf: { name: string; family: 'poultry' | 'swine' } | null) {
  const library = await loadLibrary(tx, organizationId, inputs.ingredients.map((i) => i.ingredientId), true);
  const built = buildFormulaProblem(
    // Prices are asked for at solve time, not when saving a draft.
    { ...inputs, ingredients: inputs.ingredients.map((i) => ({ ...i, pricePerKg: i.pricePerKg ?? 0 })) },
    { library, nutrients: await loadNutrientInfo(tx), species: speciesOf },
  );
  if (!built.ok) throw badRequest(built.message, built.fieldErrors);
}

async function speciesOfSpecification(db: Db, organizationId: number, specificationId: number | null) {
  if (!specificationId) return { spec: null, species: null };
  const spec = await getSpecification(db, organizationId, specificationId).catch(() => null);
  return { spec, species: spec ? spec.species : null };
}

export async function createFormula(db: Db, organizationId: number, userId: string, input: CreateInput): Promise<number> {
  const spec = await getSpecification(db, organizationId, input.specificationId).catch((e) => {
    if (e instanceof HttpError && e.status === 404) throw badRequest(`specificationId: no specification with id ${input.specificationId}`, { specificationId: [`no specification with id ${input.specificationId}`] });
    throw e;
  });
  const filled = inputsFromSpecification(spec, input.ingredients, input.batchKg);
  const inputs: FormulaInputs = {
    ...filled,
    nutrients: input.nutrients ?? filled.nutrients,
    ratios: input.ratios ?? filled.ratios,
    groups: input.groups ?? filled.groups,
  };
  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    await checkInputs(t, organizationId, inputs, spec.species);
    const [{ id }] = await t
      .insert(formulas)
      .values({ organizationId, name: input.name, speciesId: spec.species.id, specificationId: spec.id, inputs, createdByUserId: userId })
      .$returningId();
    return id;
  });
}

export async function updateFormula(db: Db, organizationId: number, id: number, input: UpdateInput): Promise<void> {
  const row = await findFormula(db, organizationId, id);
  const { species } = await speciesOfSpecification(db, organizationId, row.specificationId);
  await db.transaction(async (tx) => {
    const [locked] = await tx.select().from(formulas).where(and(eq(formulas.id, id), eq(formulas.organizationId, organizationId))).for('update');
    if (!locked) throw notFound('formula', id);
    await refuseArchived(tx as unknown as Db, locked);
    if (input.expectedRevision !== undefined && input.expectedRevision !== locked.revision) {
      throw new HttpError(409, 'version_conflict', `This formula was changed by someone else since you opened it (now revision ${locked.revision}). Reload it; your edit was not saved.`);
    }
    await checkInputs(tx as unknown as Db, organizationId, input.inputs, species);
    await tx.update(formulas).set({ name: input.name ?? locked.name, inputs: input.inputs, revision: locked.revision + 1 }).where(eq(formulas.id, id));
  });
}

// ---------------------------------------------------------------------------
// Removing
// ---------------------------------------------------------------------------

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** A list in words: "a", "a and b", "a, b and c". */
function wordList(parts: string[]): string {
  return parts.length <= 1 ? (parts[0] ?? '') : `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
}

/**
 * What holds a formula, read inside the caller's transaction; with `lock`, the formula row and its
 * versions are locked first, so no version can be kept or approved between the check and a delete
 * (keeping and approving lock the same rows). Batches are only ever recorded from an approved version,
 * so an unapproved formula cannot gain one meanwhile.
 */
async function removalOf(tx: Db, organizationId: number, id: number, lock: boolean): Promise<FormulaRemoval> {
  const formulaQuery = tx.select({ id: formulas.id, name: formulas.name, archivedAt: formulas.archivedAt }).from(formulas).where(and(eq(formulas.id, id), eq(formulas.organizationId, organizationId)));
  const [row] = lock ? await formulaQuery.for('update') : await formulaQuery;
  if (!row) throw notFound('formula', id);
  const versionQuery = tx.select(versionColumns).from(formulaVersions).where(and(eq(formulaVersions.formulaId, id), eq(formulaVersions.organizationId, organizationId))).orderBy(desc(formulaVersions.number));
  const versions = summarizeVersions((lock ? await versionQuery.for('update') : await versionQuery) as FormulaVersionRow[]);
  const versionIds = versions.map((v) => v.id);
  const [batch] = await tx
    .select({ n: count(), last: max(batchLogs.madeOn) })
    .from(batchLogs)
    .where(and(eq(batchLogs.organizationId, organizationId), versionIds.length ? or(eq(batchLogs.formulaId, id), inArray(batchLogs.versionId, versionIds)) : eq(batchLogs.formulaId, id)));
  // A share keeps a copy of the version, not a key to it: find this formula's by the copy's formula id.
  const shareRows = await tx
    .select({ payload: shares.payload, farm: organizations.name, sharedAt: shares.createdAt })
    .from(shares)
    .innerJoin(organizations, eq(organizations.id, shares.toOrganizationId))
    .where(and(eq(shares.fromOrganizationId, organizationId), eq(shares.kind, 'formula_version'), sql`CAST(JSON_VALUE(${shares.payload}, '$.version.formulaId') AS UNSIGNED) = ${id}`))
    .orderBy(asc(shares.createdAt));
  const approvedVersions = versions
    .filter((v) => v.approvedAt)
    .map((v) => ({ number: v.number, approvedBy: v.approvedBy, approvedAt: v.approvedAt!, current: v.approval === 'current' }))
    .sort((a, b) => a.number - b.number);
  const shared = shareRows.map((r) => ({ versionNumber: r.payload.kind === 'formula_version' ? r.payload.version.number : 0, farm: r.farm, sharedAt: r.sharedAt.toISOString() }));
  const batches = { count: batch?.n ?? 0, lastMadeOn: batch?.last ?? null };

  const held: string[] = [];
  if (approvedVersions.length) {
    const current = approvedVersions.find((v) => v.current);
    const others = approvedVersions.filter((v) => !v.current).map((v) => v.number);
    const parts = [];
    if (current) parts.push(`version ${current.number} is the approved version the mill makes batches from (approved by ${current.approvedBy ?? 'unknown'} on ${current.approvedAt.slice(0, 10)})`);
    if (others.length) parts.push(`${others.length === 1 ? 'version' : 'versions'} ${wordList(others.map(String))} ${others.length === 1 ? 'was' : 'were'} approved before`);
    held.push(...parts);
  }
  if (batches.count) held.push(`${plural(batches.count, 'batch was', 'batches were')} recorded from it at the mill (the last made on ${batches.lastMadeOn})`);
  if (shared.length) {
    const farms = [...new Set(shared.map((x) => x.farm))];
    held.push(`${shared.length === 1 ? 'a version of it was' : `${shared.length} of its versions were`} shared with ${wordList(farms)}`);
  }
  const name = `“${row.name}”`;
  const message = held.length
    ? `${name} cannot be deleted: ${wordList(held)}. Batch sheets, the batch log and shared links name this formula and must keep working, so it stays as it is.`
    : `Deleting ${name} removes it for good with its current inputs and ${versions.length ? `its ${plural(versions.length, 'kept version')} (none approved, none shared, no batch recorded)` : 'no kept version'}. This cannot be undone.`;
  const archiveInstead =
    held.length && !row.archivedAt
      ? {
          message: `Archive ${name} instead: it leaves the formula list${approvedVersions.some((v) => v.current) ? ' and the mill’s list of approved formulas' : ''} and becomes read-only, while batch sheets, the batch log and shared links keep working. It can be restored at any time.`,
        }
      : null;
  return { formulaId: row.id, formulaName: row.name, removable: held.length === 0, versionCount: versions.length, holds: { approvedVersions, batches, shares: shared }, message, archiveInstead };
}

/** What deleting a formula would do, or what holds it (nothing is changed). */
export async function formulaRemoval(db: Db, organizationId: number, id: number): Promise<FormulaRemoval> {
  return removalOf(db, organizationId, id, false);
}

/**
 * Deletes a formula that was never approved and has nothing recorded against it, with its kept versions,
 * in one transaction. Anything approved, recorded or shared refuses it (409 `in_use`, naming each hold)
 * and nothing is changed.
 */
export async function deleteFormula(db: Db, organizationId: number, id: number): Promise<FormulaRemoval> {
  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const removal = await removalOf(t, organizationId, id, true);
    if (!removal.removable) {
      const { approvedVersions, batches, shares: shared } = removal.holds;
      const fieldErrors: Record<string, string[]> = {};
      if (approvedVersions.length) fieldErrors.approvedVersions = approvedVersions.map((v) => `Version ${v.number}, approved by ${v.approvedBy ?? 'unknown'} on ${v.approvedAt.slice(0, 10)}${v.current ? ' (the mill uses it)' : ''}`);
      if (batches.count) fieldErrors.batches = [`${plural(batches.count, 'batch', 'batches')} recorded, the last made on ${batches.lastMadeOn}`];
      if (shared.length) fieldErrors.shares = shared.map((x) => `Version ${x.versionNumber} shared with ${x.farm} on ${x.sharedAt.slice(0, 10)}`);
      throw new HttpError(409, 'in_use', removal.message, fieldErrors);
    }
    await t.delete(formulaVersions).where(and(eq(formulaVersions.formulaId, id), eq(formulaVersions.organizationId, organizationId)));
    await t.delete(formulas).where(and(eq(formulas.id, id), eq(formulas.organizationId, organizationId)));
    return removal;
  });
}

// ---------------------------------------------------------------------------
// Archiving
// ---------------------------------------------------------------------------

/**
 * Takes a formula out of the daily view (see FormulaSummary.archived). Archiving twice is refused with
 * 409 `already_archived`, naming who did it and when, rather than answered as a silent success: the
 * second person learns that someone else already took the formula out, and nothing changes.
 */
export async function archiveFormula(db: Db, organizationId: number, userId: string, id: number): Promise<void> {
  await db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const [row] = await t.select({ name: formulas.name, archivedAt: formulas.archivedAt, archivedBy: formulas.archivedBy }).from(formulas).where(and(eq(formulas.id, id), eq(formulas.organizationId, organizationId))).for('update');
    if (!row) throw notFound('formula', id);
    if (row.archivedAt) {
      const who = row.archivedBy ? await userName(t, row.archivedBy) : 'someone';
      throw new HttpError(409, 'already_archived', `“${row.name}” was already archived by ${who} on ${day(row.archivedAt)}. Nothing changed.`);
    }
    await t.update(formulas).set({ archivedAt: new Date(), archivedBy: userId }).where(eq(formulas.id, id));
  });
}

/** Brings an archived formula back into the working list and, with its approved version, the mill's list; 409 `not_archived` otherwise. */
export async function restoreFormula(db: Db, organizationId: number, id: number): Promise<void> {
  await db.transaction(async (tx) => {
    const [row] = await tx.select({ name: formulas.name, archivedAt: formulas.archivedAt }).from(formulas).where(and(eq(formulas.id, id), eq(formulas.organizationId, organizationId))).for('update');
    if (!row) throw notFound('formula', id);
    if (!row.archivedAt) throw new HttpError(409, 'not_archived', `“${row.name}” is not archived, so there is nothing to restore. Nothing changed.`);
    await tx.update(formulas).set({ archivedAt: null, archivedBy: null }).where(eq(formulas.id, id));
  });
}

// ---------------------------------------------------------------------------
// Solving
// ---------------------------------------------------------------------------

/** Solves inputs of a formula with today's library values and prices; nothing is saved. */
async function solveWith(db: Db, organizationId: number, row: FormulaRow, inputs: FormulaInputs): Promise<FormulaSolve> {
  const { spec, species } = await speciesOfSpecification(db, organizationId, row.specificationId);
  const library = await loadLibrary(db, organizationId, inputs.ingredients.map((i) => i.ingredientId));
  const built = buildFormulaProblem(inputs, { library, nutrients: await loadNutrientInfo(db), species, name: row.name });
  if (!built.ok) throw badRequest(built.message, built.fieldErrors);
  const result = solveFormula(built.problem);
  if (result.status === 'invalid') throw badRequest(result.message, Object.fromEntries(result.errors.map((e) => [e.field, [e.message]])));
  return {
    basis: 'as fed',
    specification: spec ? { id: spec.id, name: spec.name, version: spec.version, source: spec.source } : null,
    species,
    ingredients: built.used,
    nutrients: built.nutrients,
    problem: built.problem,
    result,
    capWarnings: capWarnings(inputs, result),
    solvedAt: new Date().toISOString(),
  };
}

export async function solveFormulaInputs(db: Db, organizationId: number, id: number, inputs?: FormulaInputs): Promise<FormulaSolve> {
  const row = await findFormula(db, organizationId, id);
  await refuseArchived(db, row);
  return solveWith(db, organizationId, row, inputs ?? row.inputs);
}

/**
 * Solves and keeps: the inputs become the formula's current ones and an immutable version is written
 * with the snapshot, in one transaction (a failed write leaves neither).
 */
export async function keepVersion(db: Db, organizationId: number, userId: string, id: number, inputs: FormulaInputs | undefined, note: string | null | undefined): Promise<number> {
  const row = await findFormula(db, organizationId, id);
  await refuseArchived(db, row);
  const used = inputs ?? row.inputs;
  const solved = await solveWith(db, organizationId, row, used);
  const who = await userName(db, userId);
  return db.transaction(async (tx) => {
    const [locked] = await tx
      .select({ id: formulas.id, revision: formulas.revision, name: formulas.name, archivedAt: formulas.archivedAt, archivedBy: formulas.archivedBy })
      .from(formulas)
      .where(eq(formulas.id, id))
      .for('update');
    if (!locked) throw notFound('formula', id);
    await refuseArchived(tx as unknown as Db, locked);
    if (inputs) {
      // The solve above read the library outside this transaction: before these inputs become the
      // formula's, make sure (under the same lock a delete takes) that every ingredient is still there.
      const present = await loadLibrary(tx as unknown as Db, organizationId, inputs.ingredients.map((i) => i.ingredientId), true);
      const gone = inputs.ingredients.map((i, k) => [i.ingredientId, k] as const).filter(([ingredientId]) => !present.has(ingredientId));
      if (gone.length) throw badRequest(`No ingredient with id ${gone[0][0]} in your library any more: it was deleted meanwhile. Take it out of the formula and keep the version again.`, Object.fromEntries(gone.map(([ingredientId, k]) => [`ingredients[${k}].ingredientId`, [`no ingredient with id ${ingredientId} in your library`]])));
      await tx.update(formulas).set({ inputs, revision: locked.revision + 1 }).where(eq(formulas.id, id));
    }
    const [{ last }] = await tx.select({ last: max(formulaVersions.number) }).from(formulaVersions).where(eq(formulaVersions.formulaId, id));
    const status = solved.result.status as FormulaVersionRow['status'];
    const [{ id: versionId }] = await tx
      .insert(formulaVersions)
      .values({
        formulaId: id,
        organizationId,
        number: (last ?? 0) + 1,
        status,
        costPerTonne: solved.result.status === 'optimal' ? solved.result.costPerTonne : null,
        note: note ?? null,
        snapshot: { ...solved, inputs: used, formulaName: locked.name },
        createdByUserId: userId,
        createdByName: who,
      })
      .$returningId();
    return versionId;
  });
}

export async function listVersions(db: Db, organizationId: number, id: number): Promise<VersionSummary[]> {
  await findFormula(db, organizationId, id);
  return summarizeVersions(await versionRows(db, organizationId, [id]));
}

export async function getVersion(db: Db, organizationId: number, formulaId: number, versionId: number): Promise<VersionDetail> {
  await findFormula(db, organizationId, formulaId);
  const [row] = await db.select().from(formulaVersions).where(and(eq(formulaVersions.id, versionId), eq(formulaVersions.formulaId, formulaId), eq(formulaVersions.organizationId, organizationId)));
  if (!row) throw notFound('version', versionId);
  const summary = summarizeVersions(await versionRows(db, organizationId, [formulaId])).find((v) => v.id === versionId)!;
  return { ...summary, snapshot: row.snapshot };
}

/**
 * Approves a version. Only a version with a mix (optimal) can be approved; approving a newer one makes
 * it the version mill operators see, and the earlier approval is kept as superseded.
 */
export async function approveVersion(db: Db, organizationId: number, userId: string, formulaId: number, versionId: number): Promise<void> {
  await findFormula(db, organizationId, formulaId);
  const who = await userName(db, userId);
  await db.transaction(async (tx) => {
    // The formula row first, then the version (the order keeping and removing lock them in).
    const [formula] = await tx
      .select({ name: formulas.name, archivedAt: formulas.archivedAt, archivedBy: formulas.archivedBy })
      .from(formulas)
      .where(and(eq(formulas.id, formulaId), eq(formulas.organizationId, organizationId)))
      .for('update');
    if (!formula) throw notFound('formula', formulaId);
    await refuseArchived(tx as unknown as Db, formula);
    const [row] = await tx
      .select(versionColumns)
      .from(formulaVersions)
      .where(and(eq(formulaVersions.id, versionId), eq(formulaVersions.formulaId, formulaId), eq(formulaVersions.organizationId, organizationId)))
      .for('update');
    if (!row) throw notFound('version', versionId);
    if (row.status !== 'optimal') throw new HttpError(409, 'not_approvable', `Version ${row.number} has no mix (the specification could not be met), so it cannot be approved. Change the bounds, solve again and keep the new version.`);
    if (row.approvedAt) throw new HttpError(409, 'already_approved', `Version ${row.number} was already approved by ${row.approvedByName} on ${row.approvedAt.toISOString().slice(0, 10)}.`);
    await tx.update(formulaVersions).set({ approvedAt: new Date(), approvedByUserId: userId, approvedByName: who }).where(eq(formulaVersions.id, versionId));
  });
}

// ---------------------------------------------------------------------------
// What mill operators see: the current approved version of each formula, nothing else.
// ---------------------------------------------------------------------------

export async function listApproved(db: Db, organizationId: number): Promise<ApprovedFormula[]> {
  const approvedRows = (await db
    .select(versionColumns)
    .from(formulaVersions)
    .where(and(eq(formulaVersions.organizationId, organizationId), isNotNull(formulaVersions.approvedAt)))) as FormulaVersionRow[];
  const current = summarizeVersions(approvedRows).filter((v) => v.approval === 'current');
  if (current.length === 0) return [];
  // An archived formula's approved version leaves this list for every role that reads it (operators,
  // and planners looking at what the mill sees): archiving takes it out of the mill's daily view. Farm
  // members have no approved list: they read what was shared with their farm, and a share is a copy
  // handed over, so it stays in their list and its link keeps answering whatever the mill archives.
  const rows = await db
    .select()
    .from(formulas)
    .where(and(eq(formulas.organizationId, organizationId), isNull(formulas.archivedAt), inArray(formulas.id, current.map((v) => v.formulaId))));
  const speciesIds = [...new Set(rows.map((r) => r.speciesId).filter((x): x is number => x !== null))];
  const speciesRows = speciesIds.length ? await db.select().from(speciesTable).where(inArray(speciesTable.id, speciesIds)) : [];
  return rows
    .map((r) => ({
      formulaId: r.id,
      formulaName: r.name,
      version: current.find((v) => v.formulaId === r.id)!,
      species: speciesRows.find((s) => s.id === r.speciesId) ? { name: speciesRows.find((s) => s.id === r.speciesId)!.name } : null,
      batchKg: r.inputs.batchKg,
    }))
    .sort((a, b) => a.formulaName.localeCompare(b.formulaName));
}

/**
 * One current approved version (the batch sheet's source); any other version answers 404. Archiving
 * does not touch it on purpose: a batch sheet already printed or bookmarked, and the batch log, keep
 * working for an archived formula.
 */
export async function getApprovedVersion(db: Db, organizationId: number, versionId: number): Promise<VersionDetail> {
  const [row] = await db.select().from(formulaVersions).where(and(eq(formulaVersions.id, versionId), eq(formulaVersions.organizationId, organizationId), isNotNull(formulaVersions.approvedAt)));
  if (!row) throw notFound('approved version', versionId);
  const summary = summarizeVersions(await versionRows(db, organizationId, [row.formulaId])).find((v) => v.id === versionId)!;
  if (summary.approval !== 'current') throw notFound('approved version', versionId);
  return { ...summary, snapshot: row.snapshot };
}

// ---------------------------------------------------------------------------
// Insect meal value and comparison
// ---------------------------------------------------------------------------

export async function sweepIngredientPrice(db: Db, organizationId: number, id: number, input: SweepInput): Promise<FormulaPriceSweep> {
  const row = await findFormula(db, organizationId, id);
  await refuseArchived(db, row);
  const inputs = input.inputs ?? row.inputs;
  if (!inputs.ingredients.some((i) => i.ingredientId === input.ingredientId)) {
    throw badRequest('ingredientId: add this ingredient to the formula first', { ingredientId: ['add this ingredient to the formula first'] });
  }
  const solved = await solveWith(db, organizationId, row, inputs);
  const used = solved.ingredients.find((u) => u.ingredientId === input.ingredientId)!;
  const fromPrice = input.fromPrice ?? 0;
  const toPrice = input.toPrice ?? Math.max(0.5, Math.round(used.pricePerKg * 2 * 100) / 100);
  if (toPrice <= fromPrice) throw badRequest('toPrice: the highest price must be above the lowest', { toPrice: ['the highest price must be above the lowest'] });
  const outcome = priceSweep({ problem: solved.problem, ingredient: ingredientKey(input.ingredientId), fromPrice, toPrice, steps: input.steps ?? 41 });
  if (outcome.status === 'invalid') throw badRequest(outcome.message, Object.fromEntries(outcome.errors.map((e) => [e.field, [e.message]])));
  return { ingredientId: used.ingredientId, ingredientName: used.name, currentPricePerKg: used.pricePerKg, batchKg: inputs.batchKg, sweep: outcome };
}

export async function compareVersions(db: Db, organizationId: number, formulaId: number, a: number, b: number): Promise<VersionComparison> {
  const [va, vb] = [await getVersion(db, organizationId, formulaId, a), await getVersion(db, organizationId, formulaId, b)];
  const { snapshot: sa, ...summaryA } = va;
  const { snapshot: sb, ...summaryB } = vb;
  return { a: summaryA, b: summaryB, ...compareSolves(sa, sb) };
}
