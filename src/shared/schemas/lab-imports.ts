/**
 * Contracts of the lab-import API. The file travels as text with how to read it; the server reads it
 * again on every call, so what is saved is always what the preview showed for that text and mapping.
 */
import { z } from 'zod';

import { ESTIMATION_CLASSES } from '../lab-import/estimate';
import type { LabPreview } from '../lab-import/preview';
import { SOURCE_UNITS, type CatalogueNutrient, type ColumnMapping, type LabValue } from '../lab-import/types';
import { INGREDIENT_CATEGORIES, SPECIES_FAMILIES, type IngredientCategory } from '../library-terms';
import { insectDetailsInput, type IngredientDetail } from './ingredients';
import { isoDate } from './library-common';

const mappingEntry = z.strictObject({
  target: z.string().min(1).max(60),
  unit: z.enum(SOURCE_UNITS, { message: `unit must be one of ${SOURCE_UNITS.join(', ')}` }),
  basis: z.enum(['as_fed', 'dry_matter']),
});

const classIds = ESTIMATION_CLASSES.map((c) => c.id) as [string, ...string[]];

const readFields = {
  fileName: z.string().trim().min(1, 'name the file').max(255, 'file name at most 255 characters'),
  /** The file's text; its size and rows are checked with a message that says what to do. */
  text: z.string({ message: 'send the file’s text' }),
  labName: z.string().trim().max(200, 'lab name at most 200 characters').default(''),
  delimiter: z.enum([',', ';', '\t', 'auto']).default('auto'),
  decimal: z.enum(['.', ',', 'auto']).default('auto'),
  layout: z.enum(['sample_per_row', 'nutrient_per_row', 'auto']).default('auto'),
  basis: z.enum(['as_fed', 'dry_matter']).default('as_fed'),
  mapping: z.record(z.string().max(300), mappingEntry).optional(),
  estimation: z
    .strictObject({
      classId: z.enum(classIds, { message: 'choose the kind of ingredient' }),
      poultryEquation: z.string().max(60).nullish(),
      families: z.array(z.enum(SPECIES_FAMILIES)).min(1).optional(),
    })
    .default({ classId: 'other' }),
  /** Sample id → nutrient id → value per kg as fed in the catalogue unit; null drops an estimate. */
  overrides: z.record(z.string().max(120), z.record(z.string().max(40), z.number({ message: 'must be a number' }).min(0, 'must not be negative').max(100_000).nullable())).optional(),
};

export const previewLabImportInput = z.strictObject(readFields);
export type PreviewLabImportInput = z.input<typeof previewLabImportInput>;

const newTarget = z
  .strictObject({
    kind: z.literal('new'),
    name: z.string().trim().min(1, 'give the new ingredient a name').max(160, 'at most 160 characters'),
    category: z.enum(INGREDIENT_CATEGORIES, { message: 'choose a category' }),
    insect: insectDetailsInput.nullish(),
  })
  .superRefine((v, ctx) => {
    if (v.category === 'insect_meal' && !v.insect) ctx.addIssue({ code: 'custom', path: ['insect'], message: 'an insect meal needs its insect, processing and rearing substrate' });
    if (v.category !== 'insect_meal' && v.insect) ctx.addIssue({ code: 'custom', path: ['insect'], message: 'only insect meals carry insect details' });
  });
const existingTarget = z.strictObject({ kind: z.literal('existing'), ingredientId: z.number().int().positive() });

export const commitLabImportInput = z.strictObject({
  ...readFields,
  labName: z.string().trim().min(1, 'name the lab that sent the file').max(200, 'lab name at most 200 characters'),
  /** Date of analysis for samples whose row gives none. */
  analysedOn: isoDate.nullish(),
  samples: z
    .array(z.strictObject({ sampleId: z.string().min(1).max(120), target: z.union([newTarget, existingTarget]) }))
    .min(1, 'choose at least one sample to save')
    .max(200, 'at most 200 samples at once'),
});
export type CommitLabImportInput = z.input<typeof commitLabImportInput>;

export const labMappingQuery = z.object({ lab: z.string().trim().min(1, 'name the lab').max(200) });

/** POST /api/lab-imports/preview. */
export type LabImportPreviewResponse = LabPreview & {
  catalogue: CatalogueNutrient[];
  /** The mapping remembered for this lab, when there is one (it was applied before suggestions). */
  remembered: ColumnMapping | null;
};

export type SavedAnalysis = { id: number; sampleId: string; ingredientId: number; ingredientName: string; createdIngredient: boolean; analysedOn: string };

/** POST /api/lab-imports (201). */
export type LabImportResult = { id: number; analyses: SavedAnalysis[] };

/** GET /api/lab-imports. */
export type LabImportSummary = {
  id: number;
  labName: string;
  fileName: string;
  fileBytes: number;
  uploadedBy: string | null;
  createdAt: string;
  analyses: SavedAnalysis[];
};

/** GET /api/lab-imports/ingredients: own ingredients a file can be added to. */
export type LabTargetIngredient = { id: number; name: string; category: IngredientCategory; analyses: number };

/** How an analysis reached Troughline: a sample of an imported file, or typed in by hand on the ingredient's page. */
export type LabAnalysisEntry = 'file' | 'typed';

/** One recorded lab analysis of an ingredient, as the history shows it. */
export type LabAnalysisRecord = {
  id: number;
  entry: LabAnalysisEntry;
  /** The import it came in; null when typed in. */
  labImportId: number | null;
  fileName: string | null;
  labName: string;
  sampleId: string | null;
  sampleName: string | null;
  analysedOn: string;
  dryMatterPct: number;
  /** Who recorded it (typed it in, or uploaded the file); null when that account is gone. */
  recordedBy: string | null;
  recordedAt: string;
  /** Every value of the analysis, per kg as fed and on dry matter, with how it was obtained. */
  values: LabValue[];
  /** The nutrients whose values went into the library when the analysis was recorded. */
  applied: string[];
};

/** GET /api/lab-imports/ingredients/:id/analyses: oldest first. */
export type IngredientAnalyses = {
  ingredient: { id: number; name: string; category: IngredientCategory };
  catalogue: CatalogueNutrient[];
  analyses: LabAnalysisRecord[];
};

/** A value of an analysis left out of the library because a later-dated analysis holds that nutrient. */
export type KeptValue = { nutrientId: string; heldSince: string };

/** POST /api/ingredients/:id/lab-analyses (201): the recorded analysis and the ingredient as it now is. */
export type LabAnalysisRecorded = {
  analysis: LabAnalysisRecord;
  kept: KeptValue[];
  ingredient: IngredientDetail;
};
