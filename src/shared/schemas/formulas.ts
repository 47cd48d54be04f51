/**
 * Contracts of the formula workspace API (/api/formulas). A formula holds its current inputs; a kept
 * solve is an immutable version with a snapshot of what was used. Amounts are kg, inclusions and caps
 * % of the batch, prices currency per kg, nutrient bounds in the catalogue unit per kg — all as fed.
 * The client imports only the types from this file (zod stays on the server).
 */
import { z } from 'zod';

import { INGREDIENT_CATEGORIES, INSECT_SPECIES, type IngredientCategory, type InsectSpecies, type SpeciesFamily } from '../library-terms';
import type { FormulaProblemInput, FormulaResult, PriceSweepResult } from './formulation';

const pct = z.number({ message: 'must be a number' }).min(0, 'must not be negative').max(100, 'must be at most 100 %').nullish();
const level = z.number({ message: 'must be a number' }).min(0, 'must not be negative').max(100_000, 'must be at most 100,000').nullish();
const nutrientId = z.string().min(1, 'choose a nutrient').max(40);

function minNotAboveMax(v: { min?: number | null; max?: number | null }, ctx: z.RefinementCtx, unit = '') {
  if (v.min != null && v.max != null && v.min > v.max) ctx.addIssue({ code: 'custom', path: ['min'], message: `minimum ${v.min}${unit} is above maximum ${v.max}${unit}` });
}

/** One library ingredient the formula may use: today's library price unless `pricePerKg` is set. */
export const formulaIngredientInput = z
  .strictObject({
    ingredientId: z.number({ message: 'choose an ingredient' }).int().positive(),
    /** Currency per kg as fed; null or absent: the library's current price. */
    pricePerKg: z.number({ message: 'enter a price' }).min(0, 'a price cannot be negative').max(1_000_000, 'price per kg looks too large').nullish(),
    /** Least share of the batch, %. */
    minPct: pct,
    /** Largest share of the batch, %. */
    maxPct: pct,
  })
  .superRefine((v, ctx) => {
    if (v.minPct != null && v.maxPct != null && v.minPct > v.maxPct) ctx.addIssue({ code: 'custom', path: ['minPct'], message: `minimum ${v.minPct} % is above maximum ${v.maxPct} %` });
  });

/** A bound on a nutrient of the finished feed; neither min nor max: only reported. */
export const formulaBoundInput = z.strictObject({ nutrientId, min: level, max: level }).superRefine((v, ctx) => minNotAboveMax(v, ctx));

export const formulaRatioInput = z
  .strictObject({ numeratorId: nutrientId, denominatorId: nutrientId, min: level, max: level })
  .superRefine((v, ctx) => {
    if (v.numeratorId === v.denominatorId) ctx.addIssue({ code: 'custom', path: ['denominatorId'], message: 'a ratio needs two different nutrients' });
    if (v.min == null && v.max == null) ctx.addIssue({ code: 'custom', path: ['min'], message: 'give a minimum, a maximum or both' });
    minNotAboveMax(v, ctx);
  });

/**
 * A cap or floor on a set of the chosen ingredients: every one of a category, or every meal of one
 * insect. `testedMaxPct` is the level a feeding trial tested (from the specification): above it the
 * result warns, whatever `maxPct` the planner set.
 */
export const formulaGroupInput = z
  .strictObject({
    label: z.string().trim().min(1, 'name the group').max(160),
    scope: z.enum(['category', 'insect_species']),
    category: z.enum(INGREDIENT_CATEGORIES).nullish(),
    insectSpecies: z.enum(INSECT_SPECIES).nullish(),
    minPct: pct,
    maxPct: pct,
    testedMaxPct: pct,
    source: z.string().trim().max(300).nullish(),
  })
  .superRefine((g, ctx) => {
    if (g.scope === 'category' && !g.category) ctx.addIssue({ code: 'custom', path: ['category'], message: 'choose the category' });
    if (g.scope === 'insect_species' && !g.insectSpecies) ctx.addIssue({ code: 'custom', path: ['insectSpecies'], message: 'choose the insect' });
    if (g.minPct != null && g.maxPct != null && g.minPct > g.maxPct) ctx.addIssue({ code: 'custom', path: ['minPct'], message: `minimum ${g.minPct} % is above maximum ${g.maxPct} %` });
  });

/** Everything a solve needs besides the library: batch, ingredients with overrides, bounds. */
export const formulaInputsSchema = z
  .strictObject({
    /** Batch size, kg as fed. */
    batchKg: z.number({ message: 'enter the batch size in kg' }).gt(0, 'the batch must be more than 0 kg').max(1_000_000, 'the batch must be at most 1,000,000 kg'),
    ingredients: z.array(formulaIngredientInput).min(1, 'choose at least one ingredient').max(200, 'at most 200 ingredients'),
    nutrients: z.array(formulaBoundInput).max(200).default([]),
    ratios: z.array(formulaRatioInput).max(50).default([]),
    groups: z.array(formulaGroupInput).max(50).default([]),
  })
  .superRefine((v, ctx) => {
    const seen = new Set<number>();
    v.ingredients.forEach((i, k) => {
      if (seen.has(i.ingredientId)) ctx.addIssue({ code: 'custom', path: ['ingredients', k, 'ingredientId'], message: 'this ingredient is listed twice: keep one row' });
      seen.add(i.ingredientId);
    });
    const bounds = new Set<string>();
    v.nutrients.forEach((b, k) => {
      if (bounds.has(b.nutrientId)) ctx.addIssue({ code: 'custom', path: ['nutrients', k, 'nutrientId'], message: `${b.nutrientId} appears twice: keep one row per nutrient` });
      bounds.add(b.nutrientId);
    });
    const fixedShare = v.ingredients.reduce((s, i) => s + (i.minPct ?? 0), 0);
    if (fixedShare > 100 + 1e-9) ctx.addIssue({ code: 'custom', path: ['ingredients'], message: `the ingredient minimums add up to ${fixedShare} % of the batch, more than 100 %` });
  });
export type FormulaInputs = z.output<typeof formulaInputsSchema>;
export type FormulaInputsInput = z.input<typeof formulaInputsSchema>;
export type FormulaIngredientInput = z.output<typeof formulaIngredientInput>;
export type FormulaBoundInput = z.output<typeof formulaBoundInput>;
export type FormulaRatioInput = z.output<typeof formulaRatioInput>;
export type FormulaGroupInput = z.output<typeof formulaGroupInput>;

const formulaName = z.string().trim().min(1, 'give the formula a name').max(160, 'at most 160 characters');

/**
 * POST /api/formulas: a name, a specification (its bounds and caps fill the formula) and the chosen
 * ingredients. Bounds given here replace the specification's.
 */
export const createFormulaInput = z.strictObject({
  name: formulaName,
  specificationId: z.number({ message: 'choose a specification (species and phase)' }).int().positive(),
  batchKg: formulaInputsSchema.shape.batchKg.default(1000),
  ingredients: z.array(formulaIngredientInput).min(1, 'choose at least one ingredient').max(200),
  nutrients: z.array(formulaBoundInput).max(200).optional(),
  ratios: z.array(formulaRatioInput).max(50).optional(),
  groups: z.array(formulaGroupInput).max(50).optional(),
});
export type CreateFormulaInput = z.input<typeof createFormulaInput>;

/** PUT /api/formulas/:id: the whole current inputs; a stale `expectedRevision` answers 409. */
export const updateFormulaInput = z.strictObject({
  name: formulaName.optional(),
  inputs: formulaInputsSchema,
  expectedRevision: z.number().int().positive().optional(),
});
export type UpdateFormulaInput = z.input<typeof updateFormulaInput>;

/** POST /api/formulas/:id/solve: solve the given (unsaved) inputs, or the saved ones when absent. */
export const solveFormulaInput = z.strictObject({ inputs: formulaInputsSchema.optional() });

/** POST /api/formulas/:id/versions: solve and keep (the inputs kept also become the formula's current ones). */
export const keepVersionInput = z.strictObject({
  inputs: formulaInputsSchema.optional(),
  note: z.string().trim().max(500, 'at most 500 characters').nullish(),
});
export type KeepVersionInput = z.input<typeof keepVersionInput>;

/** POST /api/formulas/:id/price-sweep: cost and inclusion over a range of one ingredient's price. */
export const formulaPriceSweepInput = z
  .strictObject({
    ingredientId: z.number({ message: 'choose the ingredient' }).int().positive(),
    /** Currency per kg; default 0. */
    fromPrice: z.number().min(0, 'must not be negative').max(1_000_000).optional(),
    /** Currency per kg; default twice the current price (at least 0.5). */
    toPrice: z.number().min(0, 'must not be negative').max(1_000_000).optional(),
    steps: z.number().int().min(2).max(101).optional(),
    inputs: formulaInputsSchema.optional(),
  })
  .superRefine((v, ctx) => {
    if (v.fromPrice !== undefined && v.toPrice !== undefined && v.toPrice <= v.fromPrice) ctx.addIssue({ code: 'custom', path: ['toPrice'], message: 'the highest price must be above the lowest' });
  });
export type FormulaPriceSweepInput = z.input<typeof formulaPriceSweepInput>;

/**
 * GET /api/formulas: the formulas in use by default; `archived=true` lists the archived ones instead
 * (the list's "Archived" filter). Archived formulas are never mixed into the working list.
 */
export const listFormulasQuery = z.object({
  archived: z.enum(['true', 'false'], { message: 'archived must be true or false' }).default('false').transform((v) => v === 'true'),
});

export const versionParams = z.object({
  id: z.coerce.number({ message: 'must be a number' }).int().positive(),
  versionId: z.coerce.number({ message: 'must be a number' }).int().positive(),
});

/** GET /api/formulas/choices: what a new formula can be built from; with a specification, ingredients are judged for its species. */
export const choicesQuery = z.object({ specificationId: z.coerce.number().int().positive().optional() });

export const compareQuery = z.object({
  a: z.coerce.number({ message: 'choose the first version' }).int().positive(),
  b: z.coerce.number({ message: 'choose the second version' }).int().positive(),
});

// ---------------------------------------------------------------------------
// Responses
// ---------------------------------------------------------------------------

/** A nutrient as the catalogue names it. */
export type NutrientInfo = { id: string; name: string; unit: string };

/** An ingredient as it was used in a solve: its library state and the price that went in. */
export type UsedIngredient = {
  ingredientId: number;
  name: string;
  category: IngredientCategory;
  insectSpecies: InsectSpecies | null;
  /** The library row's version when it was used. */
  libraryVersion: number;
  /** The price that went into the solve, currency per kg as fed. */
  pricePerKg: number;
  /** `library`: the library's price of `priceDate`; `entered`: set in this formula. */
  priceSource: 'library' | 'entered';
  libraryPricePerKg: number | null;
  priceDate: string | null;
  /** Nutrient values per kg as fed that went into the solve. */
  values: Record<string, number>;
};

/** An ingredient the insect-protein rule keeps out of this formula, and why. */
export type RefusedIngredient = { ingredientId: number; name: string; message: string };

/** A soft cap the mix goes past: a warning, never a block. */
export type CapWarning = { label: string; percent: number; testedMaxPct: number; source: string | null; message: string };

/** A solve and everything it used: the response of /solve, and the heart of a version. */
export type FormulaSolve = {
  /** Always "as fed": every amount, price and nutrient level is per kg of feed as fed. */
  basis: 'as fed';
  specification: { id: number; name: string; version: number; source: string } | null;
  species: { id: number; name: string; family: SpeciesFamily } | null;
  ingredients: UsedIngredient[];
  nutrients: NutrientInfo[];
  /** The problem given to the engine, exactly. Ingredient ids are library ids as strings. */
  problem: FormulaProblemInput;
  result: FormulaResult;
  capWarnings: CapWarning[];
  solvedAt: string;
};

/** What a version keeps; immutable. */
export type VersionSnapshot = FormulaSolve & { inputs: FormulaInputs; formulaName: string };

export type VersionStatus = 'optimal' | 'infeasible' | 'unbounded' | 'failed';

/** `current`: the approved version mill operators see; `superseded`: approved before a newer approval. */
export type ApprovalState = 'not_approved' | 'current' | 'superseded';

export type VersionSummary = {
  id: number;
  formulaId: number;
  number: number;
  status: VersionStatus;
  costPerTonne: number | null;
  note: string | null;
  createdBy: string;
  createdAt: string;
  approvedBy: string | null;
  approvedAt: string | null;
  approval: ApprovalState;
};

export type VersionDetail = VersionSummary & { snapshot: VersionSnapshot };

export type FormulaSummary = {
  id: number;
  name: string;
  species: { id: number; name: string; family: SpeciesFamily } | null;
  specification: { id: number; name: string } | null;
  batchKg: number;
  ingredientCount: number;
  revision: number;
  updatedAt: string;
  latestVersion: VersionSummary | null;
  approvedVersion: VersionSummary | null;
  /**
   * Set while the formula is archived (POST /api/formulas/:id/archive): read-only, out of the working
   * list and of the mill's approved list; batch sheets, the batch log and shared links keep working.
   * `by` is the person's name; `at` an ISO timestamp.
   */
  archived: { at: string; by: string | null } | null;
};

/** A chosen ingredient as the library has it today (for labels; a solve reads the library again). */
export type IngredientLabel = { id: number; name: string; category: IngredientCategory; insectSpecies: InsectSpecies | null; pricePerKg: number | null; priceDate: string | null };

export type FormulaDetail = FormulaSummary & {
  inputs: FormulaInputs;
  versions: VersionSummary[];
  /** Names for the screen: the chosen ingredients and the whole nutrient catalogue. */
  labels: { ingredients: IngredientLabel[]; nutrients: NutrientInfo[] };
};

/** An approved version as a mill operator sees it (GET /api/formulas/approved). */
export type ApprovedFormula = { formulaId: number; formulaName: string; version: VersionSummary; species: { name: string } | null; batchKg: number };

/** The response of POST /api/formulas/:id/price-sweep. */
export type FormulaPriceSweep = {
  ingredientId: number;
  ingredientName: string;
  currentPricePerKg: number;
  batchKg: number;
  sweep: PriceSweepResult;
};

/**
 * What removing a formula does (GET /api/formulas/:id/removal answers this before a DELETE). A formula
 * that was never approved and has nothing recorded against it is deleted outright with its current
 * inputs and its kept versions. One with an approved version, a batch recorded from it or a version
 * shared with a farm is refused (409 `in_use`): a mixer's batch sheet, the batch log and the farm's
 * link must keep working, and they name the formula and its versions.
 */
export type FormulaRemoval = {
  formulaId: number;
  formulaName: string;
  /** True when DELETE removes it outright; false when something below holds it. */
  removable: boolean;
  /** Kept versions a delete takes with it (none of them approved or shared). */
  versionCount: number;
  holds: {
    /** Every version ever approved, current or superseded. */
    approvedVersions: { number: number; approvedBy: string | null; approvedAt: string; current: boolean }[];
    /** Batches recorded at the mill from its versions; `lastMadeOn` YYYY-MM-DD. */
    batches: { count: number; lastMadeOn: string | null };
    /** Its versions shared with farms. */
    shares: { versionNumber: number; farm: string; sharedAt: string }[];
  };
  /** What will happen, or why it cannot, in words. */
  message: string;
  /**
   * When something holds the formula and it is not archived yet: archiving takes it out of the daily
   * view instead (POST /api/formulas/:id/archive, for roles with 'formulas:approve'), in words.
   * Null when it can be deleted or is archived already.
   */
  archiveInstead: { message: string } | null;
};

/** An ingredient the picker offers: price as fed, and whether the insect-protein rule allows it for the chosen species. */
export type IngredientChoice = {
  id: number;
  name: string;
  category: IngredientCategory;
  insectSpecies: InsectSpecies | null;
  pricePerKg: number | null;
  priceDate: string | null;
  offered: { allowed: boolean; message: string | null };
};

export type SpecificationChoice = { id: number; name: string; species: { id: number; name: string; family: SpeciesFamily }; phase: { name: string; span: string | null } | null };

/** The response of GET /api/formulas/choices: the organization's own specifications and ingredients. */
export type FormulaChoices = { specifications: SpecificationChoice[]; ingredients: IngredientChoice[] };

/** Differences between two versions, b minus a. */
export type VersionComparison = {
  a: VersionSummary;
  b: VersionSummary;
  cost: { aPerTonne: number | null; bPerTonne: number | null; diffPerTonne: number | null };
  mix: { id: string; name: string; aPercent: number; bPercent: number; diffPercent: number }[];
  nutrients: { id: string; name: string; unit: string; a: number | null; b: number | null; diff: number | null }[];
};
