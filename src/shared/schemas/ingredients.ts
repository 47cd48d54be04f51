/**
 * Contracts of the ingredient API. Values are per kg as fed, in the catalogue unit of each nutrient;
 * every value belongs to a value set that says where it came from and at what dry matter.
 */
import { z } from 'zod';

import {
  CONFIDENCE_LEVELS,
  INGREDIENT_CATEGORIES,
  INSECT_PROCESSING,
  INSECT_SPECIES,
  ORIGIN_ANIMAL_CODES,
  SUBSTRATE_ORIGINS,
  VALUE_SOURCE_KINDS,
  type Confidence,
  type IngredientCategory,
  type InsectProcessing,
  type InsectSpecies,
  type LibraryName,
  type OriginAnimal,
  type SpeciesFamily,
  type SubstrateOrigin,
  type ValueSourceKind,
} from '../library-terms';
import { isoDate, libraryQuery, pageQuery } from './library-common';

export const listIngredientsQuery = z.object({
  ...pageQuery,
  library: libraryQuery.default('own'),
  category: z.enum(INGREDIENT_CATEGORIES).optional(),
  /** Mark each ingredient with whether it may be offered to this species (the insect-protein rule). */
  speciesId: z.coerce.number().int().positive().optional(),
});
export type ListIngredientsQuery = z.infer<typeof listIngredientsQuery>;

export const insectDetailsInput = z
  .strictObject({
    species: z.enum(INSECT_SPECIES, { message: 'choose the insect' }),
    processing: z.enum(INSECT_PROCESSING, { message: 'choose full-fat, partially defatted or defatted' }),
    substrate: z.string().trim().min(1, 'say what the larvae were reared on').max(200, 'at most 200 characters'),
    substrateOrigin: z.enum(SUBSTRATE_ORIGINS, { message: 'say whether the substrate is of plant or animal origin' }),
    substrateAnimals: z.array(z.enum(ORIGIN_ANIMAL_CODES)).max(10).default([]),
  })
  .superRefine((value, ctx) => {
    if ((value.substrateOrigin === 'animal' || value.substrateOrigin === 'mixed') && value.substrateAnimals.length === 0) {
      ctx.addIssue({ code: 'custom', path: ['substrateAnimals'], message: 'a substrate of animal origin must name the animals it came from' });
    }
    if ((value.substrateOrigin === 'plant' || value.substrateOrigin === 'unknown') && value.substrateAnimals.length > 0) {
      ctx.addIssue({ code: 'custom', path: ['substrateAnimals'], message: 'name animals only for a substrate of animal or mixed origin' });
    }
  });

/** Where edited values come from: they form a new value set. */
export const valueSourceInput = z
  .strictObject({
    kind: z.enum(VALUE_SOURCE_KINDS),
    name: z.string().trim().min(1, 'name the table, lab report or reason').max(300),
    confidence: z.enum(CONFIDENCE_LEVELS).default('verified'),
    analysedOn: isoDate.nullish(),
    /** The dry matter of the sample the as-fed values refer to, %. */
    dryMatterPct: z.number({ message: 'enter the dry matter, %' }).gt(0, 'dry matter must be above 0 %').max(100, 'dry matter must be at most 100 %'),
  })
  .superRefine((value, ctx) => {
    if (value.kind === 'lab' && !value.analysedOn) ctx.addIssue({ code: 'custom', path: ['analysedOn'], message: 'a lab analysis needs its date' });
  });

/** Nutrient id → value per kg as fed; null removes the value. Ranges are checked per unit on the server. */
const valuesInput = z.record(z.string().min(1).max(40), z.number({ message: 'must be a number' }).min(0, 'must not be negative').max(100_000).nullable());

const price = z.number({ message: 'enter a price' }).min(0, 'a price cannot be negative').max(1_000_000, 'price per kg looks too large');

const ingredientFields = {
  name: z.string().trim().min(1, 'give the ingredient a name').max(160, 'at most 160 characters'),
  category: z.enum(INGREDIENT_CATEGORIES, { message: 'choose a category' }),
  notes: z.string().trim().max(2000, 'at most 2,000 characters').nullish(),
  insect: insectDetailsInput.nullish(),
};

function insectNeedsDetails(value: { category?: IngredientCategory; insect?: unknown }, ctx: z.RefinementCtx) {
  if (value.category === 'insect_meal' && !value.insect) ctx.addIssue({ code: 'custom', path: ['insect'], message: 'an insect meal needs its insect, processing and rearing substrate' });
  if (value.category && value.category !== 'insect_meal' && value.insect) ctx.addIssue({ code: 'custom', path: ['insect'], message: 'only insect meals carry insect details' });
}

export const createIngredientInput = z
  .strictObject({
    ...ingredientFields,
    values: valuesInput.default({}),
    source: valueSourceInput.optional(),
    pricePerKg: price.nullish(),
    priceDate: isoDate.nullish(),
  })
  .superRefine((value, ctx) => {
    insectNeedsDetails(value, ctx);
    if (Object.values(value.values).some((v) => v !== null) && !value.source) ctx.addIssue({ code: 'custom', path: ['source'], message: 'say where the nutrient values come from' });
  });
export type CreateIngredientInput = z.input<typeof createIngredientInput>;

export const updateIngredientInput = z
  .strictObject({
    ...ingredientFields,
    name: ingredientFields.name.optional(),
    category: ingredientFields.category.optional(),
    values: valuesInput.optional(),
    source: valueSourceInput.optional(),
    /** The version the edit started from; a newer saved version answers 409 and nothing is overwritten. */
    expectedVersion: z.number().int().positive().optional(),
  });
export type UpdateIngredientInput = z.input<typeof updateIngredientInput>;

/**
 * POST /api/ingredients/:id/lab-analyses: a lab analysis typed in by hand. It is recorded in the
 * ingredient's analysis history like a sample of an imported file, and its values go into the library
 * by the same rules (see server/db/queries/lab-imports.ts `recordLabAnalysis`).
 */
export const labAnalysisInput = z.strictObject({
  laboratory: z.string().trim().min(1, 'name the laboratory or report').max(200, 'at most 200 characters'),
  /** The lab's sample or report number, when it gives one. */
  sample: z.string().trim().max(120, 'at most 120 characters').nullish(),
  analysedOn: isoDate,
  dryMatterPct: z.number({ message: 'enter the sample’s dry matter, %' }).gt(0, 'dry matter must be above 0 %').max(100, 'dry matter must be at most 100 %'),
  /** `dry_matter`: values are per kg of dry matter and are stored as fed at `dryMatterPct`. */
  basis: z.enum(['as_fed', 'dry_matter'], { message: 'say whether the values are as fed or on dry matter' }).default('as_fed'),
  /** Nutrient id → value in the catalogue unit of the nutrient, on `basis`. The dry matter has its own field. */
  values: z
    .record(z.string().min(1).max(40), z.number({ message: 'must be a number' }).min(0, 'must not be negative').max(100_000, 'must be at most 100,000'))
    .superRefine((v, ctx) => {
      if (Object.keys(v).length === 0) ctx.addIssue({ code: 'custom', message: 'enter at least one value besides the dry matter' });
      if ('dm' in v) ctx.addIssue({ code: 'custom', path: ['dm'], message: 'give the dry matter in its own field (dryMatterPct), not among the values' });
    }),
});
export type LabAnalysisInput = z.input<typeof labAnalysisInput>;

export const copyIngredientInput = z.strictObject({ name: ingredientFields.name.optional() });

export type InsectDetails = {
  species: InsectSpecies;
  processing: InsectProcessing;
  substrate: string;
  substrateOrigin: SubstrateOrigin;
  substrateAnimals: OriginAnimal[];
};

/** A family whose diets may not include this ingredient, and why. */
export type Refusal = { family: SpeciesFamily; message: string };

export type IngredientSummary = {
  id: number;
  library: LibraryName;
  name: string;
  category: IngredientCategory;
  insect: InsectDetails | null;
  pricePerKg: number | null;
  priceDate: string | null;
  version: number;
  /** A few headline values per kg as fed (dm, cp, ee, cf, ca, p, energy, lys...). */
  values: Record<string, number>;
  refusals: Refusal[];
  /** Present when the list was asked for one species: false with a message when the rule refuses it. */
  offered?: { allowed: boolean; message: string | null };
};

export type ValueSet = {
  id: number;
  sourceKind: ValueSourceKind;
  sourceName: string;
  confidence: Confidence;
  analysedOn: string | null;
  dryMatterPct: number;
  note: string | null;
};

export type PricePoint = { id: number; pricePerKg: number; effectiveOn: string; recordedAt: string };

export type IngredientDetail = IngredientSummary & {
  notes: string | null;
  copiedFromId: number | null;
  /** Every value per kg as fed, with the set it belongs to. */
  nutrientValues: { nutrientId: string; value: number; valueSetId: number }[];
  valueSets: ValueSet[];
  prices: PricePoint[];
  updatedAt: string;
};
