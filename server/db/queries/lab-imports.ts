import { and, asc, count, desc, eq, inArray } from 'drizzle-orm';
import type { z } from 'zod';

import { buildLabPreview, type CatalogueNutrient, type ColumnMapping, type LabIssue, type LabPreview, type LabValue } from '../../../src/shared/lab-import';
import { createIngredientInput, labAnalysisInput, updateIngredientInput } from '../../../src/shared/schemas/ingredients';
import type {
  commitLabImportInput,
  IngredientAnalyses,
  LabImportResult,
  LabImportSummary,
  LabTargetIngredient,
  previewLabImportInput,
  SavedAnalysis,
} from '../../../src/shared/schemas/lab-imports';
import { HttpError, notFound } from '../../http/errors';
import type { Db } from '../client';
import { ingredients, labColumnMappings, labImportAnalyses, labImports, nutrients, users } from '../schema';
import { addLabAnalysis, createIngredient, updateIngredient } from './ingredients';

type PreviewInput = z.output<typeof previewLabImportInput>;
type CommitInput = z.output<typeof commitLabImportInput>;

/** A lab's name as a key: lower case, spaces collapsed. */
export const labKey = (labName: string) => labName.trim().toLowerCase().replace(/\s+/g, ' ');

export async function loadCatalogue(db: Db): Promise<CatalogueNutrient[]> {
  return db.select({ id: nutrients.id, name: nutrients.name, unit: nutrients.unit }).from(nutrients).orderBy(asc(nutrients.sortOrder));
}

export async function getLabMapping(db: Db, organizationId: number, labName: string): Promise<ColumnMapping | null> {
  if (!labName.trim()) return null;
  const [row] = await db.select().from(labColumnMappings).where(and(eq(labColumnMappings.organizationId, organizationId), eq(labColumnMappings.labKey, labKey(labName))));
  return row?.mapping ?? null;
}

/** Reads the file with the remembered mapping of its lab. Writes nothing. */
export async function previewLabImport(db: Db, organizationId: number, input: PreviewInput) {
  const [catalogue, remembered] = await Promise.all([loadCatalogue(db), getLabMapping(db, organizationId, input.labName)]);
  const preview = buildLabPreview(input.text, input, catalogue, remembered ?? undefined);
  return { ...preview, catalogue, remembered };
}

const placeKey = (issue: LabIssue) => (issue.line !== null ? `line ${issue.line}${issue.column ? `, ${issue.column}` : ''}` : issue.column ? issue.column : 'file');

/** 400 listing every error of the file by line and column. */
function refuseFile(preview: LabPreview): HttpError {
  const errors = preview.issues.filter((i) => i.severity === 'error');
  const fieldErrors: Record<string, string[]> = {};
  for (const e of errors) (fieldErrors[placeKey(e)] ??= []).push(e.message);
  const more = errors.length > 1 ? ` (and ${errors.length - 1} more problem${errors.length > 2 ? 's' : ''})` : '';
  return new HttpError(400, 'invalid_file', `Nothing was saved. ${errors[0]?.message ?? 'The file cannot be read.'}${more}`, fieldErrors);
}

const bad = (path: string, message: string) => new HttpError(400, 'invalid_input', `${path}: ${message}`, { [path]: [message] });

/** How confident an estimate is, in the library's terms. */
const confidenceOf = (v: LabValue) => (v.origin === 'override' ? 'from_memory' : v.method?.confidence === 'from_memory' ? 'from_memory' : 'derived');

/**
 * Saves the selected samples in one transaction: the raw file with its uploader, each sample as a new
 * ingredient or a new dated analysis of an existing one (measured values as a lab value set, each
 * estimate as a value set naming its equation), the mapping for the lab. Any failure saves nothing.
 */
export async function commitLabImport(db: Db, organizationId: number, userId: string, input: CommitInput): Promise<LabImportResult> {
  const [catalogue, remembered] = await Promise.all([loadCatalogue(db), getLabMapping(db, organizationId, input.labName)]);
  const preview = buildLabPreview(input.text, input, catalogue, remembered ?? undefined);
  if (!preview.ok) throw refuseFile(preview);
  const chosen = input.samples.map((s, i) => {
    const sample = preview.samples.find((p) => p.sampleId === s.sampleId);
    if (!sample) throw bad(`samples[${i}].sampleId`, `the file has no sample “${s.sampleId}”`);
    const analysedOn = sample.analysedOn ?? input.analysedOn ?? null;
    if (!analysedOn) throw bad('analysedOn', `sample “${s.sampleId}” has no date in the file: enter the date of analysis`);
    if (sample.dryMatterPct === null) throw bad(`samples[${i}].sampleId`, `sample “${s.sampleId}” has no dry matter`);
    return { ...s, sample, analysedOn, dryMatterPct: sample.dryMatterPct };
  });
  if (new Set(input.samples.map((s) => s.sampleId)).size !== input.samples.length) throw bad('samples', 'each sample can be saved once');
  const mapping: ColumnMapping = Object.fromEntries(preview.fields.map((f) => [f.key, f.mapping]));

  return db.transaction(async (tx) => {
    const t = tx as unknown as Db;
    const [{ id: importId }] = await t
      .insert(labImports)
      .values({
        organizationId,
        uploadedByUserId: userId,
        labName: input.labName,
        fileName: input.fileName,
        fileBytes: preview.file.bytes,
        rawText: input.text,
        layout: preview.file.layout!,
        delimiter: preview.file.delimiter!,
        decimalMark: preview.file.decimal!,
        mapping,
        estimationClass: input.estimation.classId,
        poultryEquation: input.estimation.poultryEquation ?? null,
      })
      .$returningId();
    const saved: SavedAnalysis[] = [];
    for (const c of chosen) {
      const measured = Object.fromEntries(c.sample.values.filter((v) => v.origin === 'measured' || v.origin === 'calculated').map((v) => [v.nutrientId, round(v.asFed)]));
      const sourceName = `${input.labName}, sample ${c.sampleId} (${input.fileName})`.slice(0, 300);
      let ingredientId: number;
      let ingredientName: string;
      if (c.target.kind === 'new') {
        const create = createIngredientInput.parse({
          name: c.target.name,
          category: c.target.category,
          insect: c.target.insect ?? null,
          notes: `Created from a lab analysis: ${sourceName}.`,
          values: measured,
          source: { kind: 'lab', name: sourceName, confidence: 'verified', analysedOn: c.analysedOn, dryMatterPct: c.dryMatterPct },
        });
        ingredientId = await createIngredient(t, organizationId, userId, create);
        ingredientName = c.target.name;
      } else {
        ingredientId = c.target.ingredientId;
        const values = Object.fromEntries(Object.entries(measured).filter(([k]) => k !== 'dm'));
        await addLabAnalysis(t, organizationId, ingredientId, labAnalysisInput.parse({ laboratory: sourceName.slice(0, 200), analysedOn: c.analysedOn, dryMatterPct: c.dryMatterPct, basis: 'as_fed', values: Object.keys(values).length ? values : { dm: c.dryMatterPct } }));
        ingredientName = (await t.select({ name: ingredients.name }).from(ingredients).where(eq(ingredients.id, ingredientId)))[0].name;
      }
      // Each method's estimates form one value set named after it; values entered over an estimate form their own.
      const groups = new Map<string, { name: string; confidence: 'derived' | 'from_memory'; values: Record<string, number> }>();
      for (const v of c.sample.values.filter((x) => x.origin === 'estimated' || x.origin === 'override')) {
        const key = v.origin === 'override' ? 'override' : v.method!.id;
        const name = v.origin === 'override' ? `Entered over the estimate when importing ${sourceName}` : `Estimated: ${v.method!.name}, from ${sourceName}`;
        const group = groups.get(key) ?? { name: name.slice(0, 300), confidence: confidenceOf(v), values: {} };
        group.values[v.nutrientId] = round(v.asFed);
        groups.set(key, group);
      }
      for (const g of groups.values()) {
        await updateIngredient(t, organizationId, ingredientId, updateIngredientInput.parse({ values: g.values, source: { kind: 'estimate', name: g.name, confidence: g.confidence, analysedOn: c.analysedOn, dryMatterPct: c.dryMatterPct } }));
      }
      const [{ id }] = await t
        .insert(labImportAnalyses)
        .values({ labImportId: importId, organizationId, ingredientId, createdIngredient: c.target.kind === 'new' ? 1 : 0, sampleId: c.sampleId, sampleName: c.sample.name, analysedOn: c.analysedOn, dryMatterPct: c.dryMatterPct, values: c.sample.values })
        .$returningId();
      saved.push({ id, sampleId: c.sampleId, ingredientId, ingredientName, createdIngredient: c.target.kind === 'new', analysedOn: c.analysedOn });
    }
    await t
      .insert(labColumnMappings)
      .values({ organizationId, labKey: labKey(input.labName), labName: input.labName, mapping, updatedByUserId: userId })
      .onDuplicateKeyUpdate({ set: { labName: input.labName, mapping, updatedByUserId: userId } });
    return { id: importId, analyses: saved };
  });
}

const round = (v: number) => Math.round(v * 1e6) / 1e6;

async function analysesByImport(db: Db, importIds: number[]): Promise<Map<number, SavedAnalysis[]>> {
  const out = new Map<number, SavedAnalysis[]>();
  if (importIds.length === 0) return out;
  const rows = await db
    .select({ a: labImportAnalyses, name: ingredients.name })
    .from(labImportAnalyses)
    .innerJoin(ingredients, eq(ingredients.id, labImportAnalyses.ingredientId))
    .where(inArray(labImportAnalyses.labImportId, importIds))
    .orderBy(asc(labImportAnalyses.id));
  for (const { a, name } of rows) {
    const list = out.get(a.labImportId) ?? [];
    list.push({ id: a.id, sampleId: a.sampleId, ingredientId: a.ingredientId, ingredientName: name, createdIngredient: a.createdIngredient === 1, analysedOn: a.analysedOn });
    out.set(a.labImportId, list);
  }
  return out;
}

/** The organization's imports, newest first. */
export async function listLabImports(db: Db, organizationId: number, limit = 50): Promise<LabImportSummary[]> {
  const rows = await db
    .select({ i: { id: labImports.id, labName: labImports.labName, fileName: labImports.fileName, fileBytes: labImports.fileBytes, createdAt: labImports.createdAt }, user: users.name })
    .from(labImports)
    .leftJoin(users, eq(users.id, labImports.uploadedByUserId))
    .where(eq(labImports.organizationId, organizationId))
    .orderBy(desc(labImports.createdAt), desc(labImports.id))
    .limit(limit);
  const analyses = await analysesByImport(db, rows.map((r) => r.i.id));
  return rows.map(({ i, user }) => ({ ...i, uploadedBy: user, createdAt: i.createdAt.toISOString(), analyses: analyses.get(i.id) ?? [] }));
}

/** The raw file of an import of this organization, or 404. */
export async function getLabImportFile(db: Db, organizationId: number, id: number): Promise<{ fileName: string; rawText: string }> {
  const [row] = await db.select({ fileName: labImports.fileName, rawText: labImports.rawText }).from(labImports).where(and(eq(labImports.id, id), eq(labImports.organizationId, organizationId)));
  if (!row) throw notFound('lab import', id);
  return row;
}

/** The organization's own ingredients, with how many imported analyses each has. */
export async function listTargetIngredients(db: Db, organizationId: number): Promise<LabTargetIngredient[]> {
  const rows = await db.select({ id: ingredients.id, name: ingredients.name, category: ingredients.category }).from(ingredients).where(eq(ingredients.organizationId, organizationId)).orderBy(asc(ingredients.name)).limit(500);
  const counts = await db
    .select({ ingredientId: labImportAnalyses.ingredientId, n: count() })
    .from(labImportAnalyses)
    .where(eq(labImportAnalyses.organizationId, organizationId))
    .groupBy(labImportAnalyses.ingredientId);
  const byId = new Map(counts.map((c) => [c.ingredientId, c.n]));
  return rows.map((r) => ({ ...r, analyses: byId.get(r.id) ?? 0 }));
}

/** Every imported analysis of one of the organization's ingredients, oldest first, for comparison. */
export async function listIngredientAnalyses(db: Db, organizationId: number, ingredientId: number): Promise<IngredientAnalyses> {
  const [ingredient] = await db.select({ id: ingredients.id, name: ingredients.name, category: ingredients.category }).from(ingredients).where(and(eq(ingredients.id, ingredientId), eq(ingredients.organizationId, organizationId)));
  if (!ingredient) throw notFound('ingredient', ingredientId);
  const rows = await db
    .select({ a: labImportAnalyses, labName: labImports.labName, fileName: labImports.fileName, user: users.name })
    .from(labImportAnalyses)
    .innerJoin(labImports, eq(labImports.id, labImportAnalyses.labImportId))
    .leftJoin(users, eq(users.id, labImports.uploadedByUserId))
    .where(and(eq(labImportAnalyses.organizationId, organizationId), eq(labImportAnalyses.ingredientId, ingredientId)))
    .orderBy(asc(labImportAnalyses.analysedOn), asc(labImportAnalyses.id));
  return {
    ingredient,
    catalogue: await loadCatalogue(db),
    analyses: rows.map(({ a, labName, fileName, user }) => ({
      id: a.id,
      labImportId: a.labImportId,
      sampleId: a.sampleId,
      sampleName: a.sampleName,
      analysedOn: a.analysedOn,
      dryMatterPct: a.dryMatterPct,
      labName,
      fileName,
      uploadedBy: user,
      values: a.values,
    })),
  };
}
