/**
 * Contracts of the requirement API: species, phases and specifications. Bounds are per kg of feed as fed
 * in the nutrient's catalogue unit; caps are % of the feed.
 */
import { z } from 'zod';

import {
  CAP_SCOPES,
  INGREDIENT_CATEGORIES,
  INSECT_SPECIES,
  SPECIES_FAMILIES,
  type CapScope,
  type Confidence,
  type IngredientCategory,
  type InsectSpecies,
  type LibraryName,
  type SpeciesFamily,
} from '../library-terms';
import { libraryQuery, pageQuery } from './library-common';

const optionalLevel = z.number({ message: 'must be a number' }).min(0, 'must not be negative').max(100_000).nullish();
const pct = z.number({ message: 'must be a number' }).min(0, 'must not be negative').max(100, 'must be at most 100 %').nullish();

export const listSpecificationsQuery = z.object({
  ...pageQuery,
  library: libraryQuery.default('own'),
  speciesId: z.coerce.number().int().positive().optional(),
});

export const boundInput = z
  .strictObject({ nutrientId: z.string().min(1).max(40), min: optionalLevel, max: optionalLevel, note: z.string().trim().max(300).nullish() })
  .superRefine((b, ctx) => {
    if (b.min == null && b.max == null) ctx.addIssue({ code: 'custom', path: ['min'], message: 'give a minimum, a maximum or both' });
    if (b.min != null && b.max != null && b.min > b.max) ctx.addIssue({ code: 'custom', path: ['min'], message: `minimum ${b.min} is above maximum ${b.max}` });
  });

export const ratioInput = z
  .strictObject({
    numeratorId: z.string().min(1).max(40),
    denominatorId: z.string().min(1).max(40),
    min: optionalLevel,
    max: optionalLevel,
    note: z.string().trim().max(300).nullish(),
  })
  .superRefine((r, ctx) => {
    if (r.numeratorId === r.denominatorId) ctx.addIssue({ code: 'custom', path: ['denominatorId'], message: 'a ratio needs two different nutrients' });
    if (r.min == null && r.max == null) ctx.addIssue({ code: 'custom', path: ['min'], message: 'give a minimum, a maximum or both' });
    if (r.min != null && r.max != null && r.min > r.max) ctx.addIssue({ code: 'custom', path: ['min'], message: `minimum ${r.min} is above maximum ${r.max}` });
  });

export const capInput = z
  .strictObject({
    scope: z.enum(CAP_SCOPES),
    ingredientId: z.number().int().positive().nullish(),
    category: z.enum(INGREDIENT_CATEGORIES).nullish(),
    insectSpecies: z.enum(INSECT_SPECIES).nullish(),
    minPct: pct,
    maxPct: pct,
    /** A tested level: above it the result warns and is never blocked. */
    soft: z.boolean().default(true),
    source: z.string().trim().min(1, 'name the study or practice the cap comes from').max(300),
    note: z.string().trim().max(300).nullish(),
  })
  .superRefine((c, ctx) => {
    if (c.scope === 'ingredient' && !c.ingredientId) ctx.addIssue({ code: 'custom', path: ['ingredientId'], message: 'choose the ingredient' });
    if (c.scope === 'category' && !c.category) ctx.addIssue({ code: 'custom', path: ['category'], message: 'choose the category' });
    if (c.scope === 'insect_species' && !c.insectSpecies) ctx.addIssue({ code: 'custom', path: ['insectSpecies'], message: 'choose the insect' });
    if (c.minPct == null && c.maxPct == null) ctx.addIssue({ code: 'custom', path: ['maxPct'], message: 'give a minimum, a maximum or both' });
    if (c.minPct != null && c.maxPct != null && c.minPct > c.maxPct) ctx.addIssue({ code: 'custom', path: ['minPct'], message: `minimum ${c.minPct} % is above maximum ${c.maxPct} %` });
  });

const specificationFields = {
  speciesId: z.number({ message: 'choose a species' }).int().positive(),
  phaseId: z.number().int().positive().nullish(),
  name: z.string().trim().min(1, 'give the specification a name').max(160),
  source: z.string().trim().min(1, 'say where the numbers come from').max(300),
  notes: z.string().trim().max(2000).nullish(),
  feedIntakeGPerDay: z.number().gt(0, 'feed intake must be above 0 g a day').max(20_000).nullish(),
  bounds: z.array(boundInput).max(200).default([]),
  ratios: z.array(ratioInput).max(50).default([]),
  caps: z.array(capInput).max(200).default([]),
};

function noDuplicateBounds(value: { bounds?: { nutrientId: string }[] }, ctx: z.RefinementCtx) {
  const seen = new Set<string>();
  value.bounds?.forEach((b, i) => {
    if (seen.has(b.nutrientId)) ctx.addIssue({ code: 'custom', path: ['bounds', i, 'nutrientId'], message: `${b.nutrientId} appears twice: keep one row per nutrient` });
    seen.add(b.nutrientId);
  });
}

export const createSpecificationInput = z.strictObject(specificationFields).superRefine(noDuplicateBounds);
export type CreateSpecificationInput = z.input<typeof createSpecificationInput>;

/** PUT /api/specifications/:id replaces the whole specification. */
export const updateSpecificationInput = z
  .strictObject({ ...specificationFields, expectedVersion: z.number().int().positive().optional() })
  .superRefine(noDuplicateBounds);
export type UpdateSpecificationInput = z.input<typeof updateSpecificationInput>;

/**
 * POST /api/specifications/:id/copy. Without `phaseId` the copy keeps its source's species and phase; with
 * it, the copy goes into that phase (of the same species, or of another species of the same family).
 */
export const copySpecificationInput = z.strictObject({
  name: specificationFields.name.optional(),
  phaseId: z.number({ message: 'choose the phase to copy into' }).int().positive().nullish(),
});
export type CopySpecificationInput = z.input<typeof copySpecificationInput>;

export const createSpeciesInput = z.strictObject({
  name: z.string().trim().min(1, 'name the species').max(120),
  family: z.enum(SPECIES_FAMILIES, { message: 'choose poultry or pigs' }),
});
export type CreateSpeciesInput = z.input<typeof createSpeciesInput>;

export const createPhaseInput = z
  .strictObject({
    name: z.string().trim().min(1, 'name the phase').max(120),
    span: z.string().trim().max(120).nullish(),
    ageFromDays: z.number().int().min(0).max(5000).nullish(),
    ageToDays: z.number().int().min(0).max(5000).nullish(),
    bodyWeightFromKg: z.number().min(0).max(1000).nullish(),
    bodyWeightToKg: z.number().min(0).max(1000).nullish(),
  })
  .superRefine((p, ctx) => {
    if (p.ageFromDays != null && p.ageToDays != null && p.ageFromDays > p.ageToDays) ctx.addIssue({ code: 'custom', path: ['ageToDays'], message: 'the phase must end after it starts' });
    if (p.bodyWeightFromKg != null && p.bodyWeightToKg != null && p.bodyWeightFromKg > p.bodyWeightToKg) ctx.addIssue({ code: 'custom', path: ['bodyWeightToKg'], message: 'the upper weight must be above the lower' });
  });

export type CreatePhaseInput = z.input<typeof createPhaseInput>;

export const listSpeciesQuery = z.object({ ...pageQuery, pageSize: pageQuery.pageSize.default(200), family: z.enum(SPECIES_FAMILIES).optional() });

export type Phase = {
  id: number;
  speciesId: number;
  library: LibraryName;
  name: string;
  span: string | null;
  ageFromDays: number | null;
  ageToDays: number | null;
  bodyWeightFromKg: number | null;
  bodyWeightToKg: number | null;
};

export type Species = { id: number; library: LibraryName; code: string; name: string; family: SpeciesFamily; phases: Phase[] };

export type SpecificationSummary = {
  id: number;
  library: LibraryName;
  name: string;
  source: string;
  species: { id: number; name: string; family: SpeciesFamily };
  phase: { id: number; name: string; span: string | null } | null;
  boundCount: number;
  version: number;
};

export type SpecificationBound = { nutrientId: string; min: number | null; max: number | null; confidence: Confidence | null; note: string | null };
export type SpecificationRatio = { numeratorId: string; denominatorId: string; min: number | null; max: number | null; confidence: Confidence | null; note: string | null };
export type SpecificationCap = {
  scope: CapScope;
  ingredientId: number | null;
  ingredientName: string | null;
  category: IngredientCategory | null;
  insectSpecies: InsectSpecies | null;
  minPct: number | null;
  maxPct: number | null;
  soft: boolean;
  source: string;
  note: string | null;
};

export type SpecificationDetail = SpecificationSummary & {
  notes: string | null;
  feedIntakeGPerDay: number | null;
  copiedFromId: number | null;
  bounds: SpecificationBound[];
  ratios: SpecificationRatio[];
  caps: SpecificationCap[];
  /** Insect meals of the organization's library that may not go into this species' diets, and why. */
  refusedIngredients: { id: number; name: string; message: string }[];
  updatedAt: string;
};
