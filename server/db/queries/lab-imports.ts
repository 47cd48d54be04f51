import { and, asc, count, desc, eq, inArray, sql } from 'drizzle-orm';
import type { z } from 'zod';

import { buildLabPreview, onDryMatter, PLAUSIBLE_MAX_ON_DM, type CatalogueNutrient, type ColumnMapping, type LabIssue, type LabPreview, type LabValue, type SourceUnit } from '../../../src/shared/lab-import';
import { createIngredientInput, type labAnalysisInput } from '../../../src/shared/schemas/ingredients';
import type {
  commitLabImportInput,
  IngredientAnalyses,
  KeptValue,
  LabAnalysisEntry,
  LabAnalysisRecord,
  LabAnalysisRecorded,
  LabImportResult,
  LabImportSummary,
  LabTargetIngredient,
  previewLabImportInput,
  SavedAnalysis,
} from '../../../src/shared/schemas/lab-imports';
import { convertUnit, dryMatterToAsFed } from '../../../src/shared/units';
import { badRequest, HttpError, notFound } from '../../http/errors';
import type { Db } from '../client';
import { ingredients, labColumnMappings, labImportAnalyses, labImports, nutrients, users } from '../schema';
import { applyLabAnalysis, createIngredient, getIngredient } from './ingredients';
import { checkNutrientValues } from './library-shared';

type PreviewInput = z.output<typeof previewLabImportInput>;
type CommitInput = z.output<typeof commitLabImportInput>;
type TypedInput = z.output<typeof labAnalysisInput>;

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
    for (const [i, c] of chosen.entries()) {
      let ingredientId: number;
      if (c.target.kind === 'new') {
        const create = createIngredientInput.parse({
          name: c.target.name,
          category: c.target.category,
          insect: c.target.insect ?? null,
          notes: `Created from a lab analysis: ${sourceNameOf({ entry: 'file', labName: input.labName, sampleId: c.sampleId, fileName: input.fileName })}.`,
        });
        ingredientId = await createIngredient(t, organizationId, userId, create);
      } else {
        ingredientId = c.target.ingredientId;
      }
      const recorded = await recordLabAnalysis(t, organizationId, userId, {
        ingredientId,
        entry: 'file',
        labImportId: importId,
        fileName: input.fileName,
        labName: input.labName,
        sampleId: c.sampleId,
        sampleName: c.sample.name,
        analysedOn: c.analysedOn,
        dryMatterPct: c.dryMatterPct,
        values: c.sample.values,
        createdIngredient: c.target.kind === 'new',
        datePath: `samples[${i}].sampleId`,
      });
      const [{ name: ingredientName }] = await t.select({ name: ingredients.name }).from(ingredients).where(eq(ingredients.id, ingredientId));
      saved.push({ id: recorded.id, sampleId: c.sampleId, ingredientId, ingredientName, createdIngredient: c.target.kind === 'new', analysedOn: c.analysedOn });
    }
    await t
      .insert(labColumnMappings)
      .values({ organizationId, labKey: labKey(input.labName), labName: input.labName, mapping, updatedByUserId: userId })
      .onDuplicateKeyUpdate({ set: { labName: input.labName, mapping, updatedByUserId: userId } });
    return { id: importId, analyses: saved };
  });
}

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
    if (a.labImportId === null) continue;
    const list = out.get(a.labImportId) ?? [];
    list.push({ id: a.id, sampleId: a.sampleId ?? '', ingredientId: a.ingredientId, ingredientName: name, createdIngredient: a.createdIngredient === 1, analysedOn: a.analysedOn });
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

/** Reads history rows as the API shows them; rows saved before typed analyses take lab and uploader from their import. */
async function analysisRecords(db: Db, where: ReturnType<typeof and>): Promise<LabAnalysisRecord[]> {
  const rows = await db
    .select({ a: labImportAnalyses, importLab: labImports.labName, fileName: labImports.fileName, user: users.name, email: users.email })
    .from(labImportAnalyses)
    .leftJoin(labImports, eq(labImports.id, labImportAnalyses.labImportId))
    .leftJoin(users, eq(users.id, sql`COALESCE(${labImportAnalyses.recordedByUserId}, ${labImports.uploadedByUserId})`))
    .where(where)
    .orderBy(asc(labImportAnalyses.analysedOn), asc(labImportAnalyses.id));
  return rows.map(({ a, importLab, fileName, user, email }) => ({
    id: a.id,
    entry: a.entry,
    labImportId: a.labImportId,
    fileName,
    labName: a.laboratory ?? importLab ?? '',
    sampleId: a.sampleId,
    sampleName: a.sampleName,
    analysedOn: a.analysedOn,
    dryMatterPct: a.dryMatterPct,
    recordedBy: user || email || null,
    recordedAt: a.createdAt.toISOString(),
    values: a.values,
    applied: a.appliedNutrientIds ?? a.values.map((v) => v.nutrientId),
  }));
}

/** Every recorded analysis (imported or typed in) of one of the organization's ingredients, oldest first, for comparison. */
export async function listIngredientAnalyses(db: Db, organizationId: number, ingredientId: number): Promise<IngredientAnalyses> {
  const [ingredient] = await db.select({ id: ingredients.id, name: ingredients.name, category: ingredients.category }).from(ingredients).where(and(eq(ingredients.id, ingredientId), eq(ingredients.organizationId, organizationId)));
  if (!ingredient) throw notFound('ingredient', ingredientId);
  return {
    ingredient,
    catalogue: await loadCatalogue(db),
    analyses: await analysisRecords(db, and(eq(labImportAnalyses.organizationId, organizationId), eq(labImportAnalyses.ingredientId, ingredientId))),
  };
}

/** How a recorded analysis is named on the value sets it writes. */
function sourceNameOf(a: { entry: LabAnalysisEntry; labName: string; sampleId: string | null; fileName: string | null }): string {
  const sample = a.sampleId ? `, sample ${a.sampleId}` : '';
  const how = a.entry === 'file' ? ` (${a.fileName})` : ' (typed in by hand)';
  return `${a.labName}${sample}${how}`.slice(0, 300);
}

/** The latest date an analysis may carry: tomorrow in UTC, so a lab a time zone ahead is not refused. */
const latestAnalysisDate = () => new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);

export type AnalysisToRecord = {
  ingredientId: number;
  entry: LabAnalysisEntry;
  labImportId: number | null;
  fileName: string | null;
  labName: string;
  sampleId: string | null;
  sampleName: string | null;
  analysedOn: string;
  dryMatterPct: number;
  /** As the reader made them: per kg as fed in catalogue units, each with its dry-matter equivalent and origin. */
  values: LabValue[];
  createdIngredient: boolean;
  /** The request field a refused date is reported under. */
  datePath: string;
};

/**
 * Records one lab analysis of an ingredient, inside the caller's transaction: the same for a sample of
 * an imported file and for an analysis typed in. Its values go into the library through
 * `applyLabAnalysis` (the one set of rules for what an analysis replaces), and the analysis is kept in
 * the history with who recorded it and which of its values were applied.
 */
export async function recordLabAnalysis(tx: Db, organizationId: number, userId: string, a: AnalysisToRecord): Promise<{ id: number; applied: string[]; kept: KeptValue[] }> {
  if (a.analysedOn > latestAnalysisDate()) throw bad(a.datePath, `the date of analysis ${a.analysedOn} is in the future: check it`);
  const { applied, kept } = await applyLabAnalysis(tx, organizationId, a.ingredientId, { sourceName: sourceNameOf(a), analysedOn: a.analysedOn, dryMatterPct: a.dryMatterPct, values: a.values });
  const [{ id }] = await tx
    .insert(labImportAnalyses)
    .values({
      labImportId: a.labImportId,
      organizationId,
      ingredientId: a.ingredientId,
      entry: a.entry,
      laboratory: a.labName.slice(0, 200),
      recordedByUserId: userId,
      createdIngredient: a.createdIngredient ? 1 : 0,
      sampleId: a.sampleId,
      sampleName: a.sampleName,
      analysedOn: a.analysedOn,
      dryMatterPct: a.dryMatterPct,
      values: a.values,
      appliedNutrientIds: applied,
    })
    .$returningId();
  return { id, applied, kept };
}

/** Highest energy per kg of dry matter any feed reaches (common practice: fats have about 9,400 kcal gross energy per kg). */
const ENERGY_MAX_KCAL_DM = 9500;
/** The proximate fractions, which together cannot exceed the dry matter. */
const PROXIMATE = ['cp', 'ee', 'cf', 'ash', 'starch'];
const fmt = (n: number) => String(Math.round(n * 100) / 100);

/**
 * The values of a typed analysis as the file reader makes them: each typed number in its nutrient's
 * catalogue unit, put as fed at the analysis's dry matter when typed on dry matter (value × DM / 100),
 * with its dry-matter equivalent, marked measured and keeping what was typed. Refuses, field by field,
 * what the file reader refuses: a value implausible on dry matter, proximate fractions above 100 % of it.
 */
export function typedLabValues(input: TypedInput, catalogue: readonly CatalogueNutrient[]): LabValue[] {
  const dm = input.dryMatterPct;
  const values: LabValue[] = [{ nutrientId: 'dm', asFed: dm, dryMatter: 100, unit: '%', origin: 'measured', reported: { value: dm, unit: '%', basis: 'as_fed' } }];
  const fieldErrors: Record<string, string[]> = {};
  for (const [nutrientId, typed] of Object.entries(input.values)) {
    const nutrient = catalogue.find((n) => n.id === nutrientId)!;
    const asFed = input.basis === 'dry_matter' ? dryMatterToAsFed(typed, dm) : typed;
    const onDm = onDryMatter(nutrientId, asFed, dm);
    const rule = PLAUSIBLE_MAX_ON_DM[nutrientId];
    const what = input.basis === 'dry_matter' ? `${fmt(typed)} ${nutrient.unit} on dry matter` : `${fmt(typed)} ${nutrient.unit} as fed at ${fmt(dm)} % dry matter is ${fmt(onDm)} ${nutrient.unit} of the dry matter`;
    if (rule && onDm > rule.max) fieldErrors[`values.${nutrientId}`] = [`${what}, above the plausible ${rule.max} % (${rule.why}): check the value, its basis and the dry matter`];
    else if (!rule && nutrient.unit === '%' && onDm > 100) fieldErrors[`values.${nutrientId}`] = [`${what}, more than the whole dry matter: check the value, its basis and the dry matter`];
    else if ((nutrient.unit === 'kcal/kg' || nutrient.unit === 'MJ/kg') && convertUnit(onDm, nutrient.unit, 'kcal/kg') > ENERGY_MAX_KCAL_DM) {
      fieldErrors[`values.${nutrientId}`] = [`${fmt(onDm)} ${nutrient.unit} per kg of dry matter is above any feed (fats have about 9,400 kcal gross energy per kg): check the value and its unit`];
    }
    values.push({ nutrientId, asFed, dryMatter: onDm, unit: nutrient.unit, origin: 'measured', reported: { value: typed, unit: nutrient.unit as SourceUnit, basis: input.basis } });
  }
  const proximate = values.filter((v) => PROXIMATE.includes(v.nutrientId));
  const sum = proximate.reduce((s, v) => s + v.dryMatter, 0);
  if (proximate.length >= 2 && sum > 100 + 1e-9) {
    const message = `the proximate fractions (${proximate.map((v) => v.nutrientId).join(', ')}) add up to ${fmt(sum)} % of the dry matter, more than 100 %: check their basis and the dry matter`;
    for (const v of proximate) (fieldErrors[`values.${v.nutrientId}`] ??= []).push(message);
  }
  const first = Object.entries(fieldErrors)[0];
  if (first) throw badRequest(`${first[0]}: ${first[1][0]}`, fieldErrors);
  return values;
}

/**
 * Records an analysis typed in on the ingredient's page: checked like a file's sample, applied and kept
 * in the history by `recordLabAnalysis`, all in one transaction.
 */
export async function recordTypedAnalysis(db: Db, organizationId: number, userId: string, ingredientId: number, input: TypedInput): Promise<LabAnalysisRecorded> {
  await checkNutrientValues(db, input.values);
  const values = typedLabValues(input, await loadCatalogue(db));
  const { id, kept } = await db.transaction(async (tx) =>
    recordLabAnalysis(tx as unknown as Db, organizationId, userId, {
      ingredientId,
      entry: 'typed',
      labImportId: null,
      fileName: null,
      labName: input.laboratory,
      sampleId: input.sample || null,
      sampleName: null,
      analysedOn: input.analysedOn,
      dryMatterPct: input.dryMatterPct,
      values,
      createdIngredient: false,
      datePath: 'analysedOn',
    }),
  );
  const [analysis] = await analysisRecords(db, and(eq(labImportAnalyses.organizationId, organizationId), eq(labImportAnalyses.id, id)));
  return { analysis, kept, ingredient: await getIngredient(db, organizationId, ingredientId) };
}
