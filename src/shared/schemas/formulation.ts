/**
 * Contracts for the formulation JSON formats (problem in, result out), shared by the
 * server, the command line, the engine and the app. Input is validated with zod; the
 * result shapes are plain types because only Troughline itself produces them.
 *
 * Units: amounts in kg, prices in currency per kg as fed, nutrient values per kg as
 * fed in whatever unit the user chose (%, g/kg, kcal/kg, MJ/kg ...), the same unit for
 * the ingredient values and for the bounds on the finished mix.
 *
 * Every object is strict: an unknown key (say `Max` for `max`) is an error, because a
 * silently ignored fat ceiling is worse than a rejected request.
 * See src/shared/engine/README.md for the full format description.
 */
import { z } from 'zod';

/** Hard size limits: beyond these a request is refused with a message, never left to run. */
export const LIMITS = {
  ingredients: 2000,
  /** Nutrient, ratio and group bounds together, per formula. */
  bounds: 500,
  nutrientsPerIngredient: 500,
  groupMembers: 2000,
  formulas: 200,
  /** Ingredient columns summed over all formulas of an allocation. */
  allocationColumns: 20000,
  sweepSteps: 201,
  mixEntries: 2000,
} as const;

const idSchema = z
  .string()
  .min(1, 'must not be empty')
  .max(100, 'must be at most 100 characters');
const nameSchema = z.string().max(200).optional();
const kgSchema = z.number().min(0, 'must not be negative').max(1e9, 'must be at most 1e9 kg');
const percentSchema = z.number().min(0, 'must not be negative').max(100, 'must be at most 100 %');
const levelSchema = z.number().min(-1e12).max(1e12);

const nutrientValuesSchema = z
  .record(idSchema, z.number().min(-1e9).max(1e9))
  .refine((m) => Object.keys(m).length <= LIMITS.nutrientsPerIngredient, {
    message: `at most ${LIMITS.nutrientsPerIngredient} nutrients per ingredient`,
  });

/** One ingredient: price, composition per kg as fed, and its inclusion limits in the batch. */
export const ingredientSchema = z.strictObject({
  id: idSchema,
  name: nameSchema,
  /** Currency per kg as fed; >= 0. */
  pricePerKg: z.number().min(0, 'price must not be negative').max(1e9),
  /** Least amount in the batch, kg. */
  minKg: kgSchema.optional(),
  /** Largest amount in the batch, kg. */
  maxKg: kgSchema.optional(),
  /** Exact amount in the batch, kg (excludes minKg/maxKg/minPercent/maxPercent). */
  fixedKg: kgSchema.optional(),
  /** Least share of the batch, % (alternative to minKg). */
  minPercent: percentSchema.optional(),
  /** Largest share of the batch, % (alternative to maxKg). */
  maxPercent: percentSchema.optional(),
  /** Stock on hand, kg: an upper limit on use. In an allocation it is shared by all formulas. */
  stockKg: kgSchema.optional(),
  /** Nutrient id → value per kg as fed. Missing nutrients count as 0. */
  nutrients: nutrientValuesSchema.default({}),
});

/** A bound on a nutrient level in the finished mix (same unit as the ingredient values). */
export const nutrientBoundSchema = z.strictObject({
  id: idSchema,
  name: nameSchema,
  /** Display unit, e.g. "%", "g/kg", "kcal/kg". Used only in messages and shadow-price steps. */
  unit: z.string().max(20).optional(),
  min: levelSchema.optional(),
  max: levelSchema.optional(),
  /** Step in which a nutritionist reads this nutrient's shadow price (default by unit: % → 0.1, kcal/kg → 100, else 1). */
  step: z.number().positive().max(1e9).optional(),
});

/** A bound on factor × numerator / denominator in the finished mix, linearised exactly. */
export const ratioBoundSchema = z.strictObject({
  /** Defaults to "numerator:denominator". */
  id: idSchema.optional(),
  name: nameSchema,
  numerator: idSchema,
  denominator: idSchema,
  min: z.number().min(0, 'must not be negative').max(1e9).optional(),
  max: z.number().min(0, 'must not be negative').max(1e9).optional(),
  /** Unit conversion applied to the ratio, e.g. 10000 for SID Lys % : NE kcal/kg in g/Mcal. Default 1. */
  factor: z.number().positive().max(1e9).optional(),
  unit: z.string().max(20).optional(),
});

/** A cap and/or floor on the total of a set of ingredients. */
export const groupBoundSchema = z.strictObject({
  id: idSchema,
  name: nameSchema,
  members: z.array(idSchema).min(1, 'needs at least one member').max(LIMITS.groupMembers),
  minKg: kgSchema.optional(),
  maxKg: kgSchema.optional(),
  minPercent: percentSchema.optional(),
  maxPercent: percentSchema.optional(),
});

/** Solve options. */
export const solveOptionsSchema = z.strictObject({
  /** Compute shadow prices and price ranging (default true). */
  sensitivity: z.boolean().optional(),
  /** Explain infeasibility with the cheapest relaxation (default true). */
  diagnose: z.boolean().optional(),
  /** Largest accepted bound violation, relative to the largest coefficient of its row (default 1e-7). */
  tolerance: z.number().min(1e-12).max(1e-3).optional(),
});

const formulaShape = {
  name: nameSchema,
  /** Currency label for messages, e.g. "EUR". */
  currency: z.string().max(10).optional(),
  /** Size of the batch, kg; > 0. Results come in kg of this batch and in %. */
  batchKg: z.number().positive('batch must be more than 0 kg').max(1e9, 'batch must be at most 1e9 kg'),
  ingredients: z
    .array(ingredientSchema)
    .min(1, 'needs at least one ingredient')
    .max(LIMITS.ingredients, `at most ${LIMITS.ingredients} ingredients (problem size limit)`),
  nutrients: z.array(nutrientBoundSchema).max(LIMITS.bounds, `at most ${LIMITS.bounds} nutrient bounds`).default([]),
  ratios: z.array(ratioBoundSchema).max(LIMITS.bounds, `at most ${LIMITS.bounds} ratio bounds`).default([]),
  groups: z.array(groupBoundSchema).max(LIMITS.bounds, `at most ${LIMITS.bounds} groups`).default([]),
  options: solveOptionsSchema.optional(),
};

type Ctx = z.RefinementCtx;
type Path = (string | number)[];

function issue(ctx: Ctx, path: Path, message: string) {
  ctx.addIssue({ code: 'custom', message, path });
}

function checkMinMax(ctx: Ctx, path: Path, min: number | undefined, max: number | undefined, what = 'min', whatMax = 'max') {
  if (min !== undefined && max !== undefined && min > max) {
    issue(ctx, [...path, what], `${what} ${min} is above ${whatMax} ${max}`);
  }
}

interface FormulaLike {
  ingredients: z.infer<typeof ingredientSchema>[];
  nutrients: z.infer<typeof nutrientBoundSchema>[];
  ratios: z.infer<typeof ratioBoundSchema>[];
  groups: z.infer<typeof groupBoundSchema>[];
}

/** Cross-field checks shared by every format that carries a formula. */
function checkFormula(p: FormulaLike, ctx: Ctx, base: Path = []) {
  const bounds = p.nutrients.length + p.ratios.length + p.groups.length;
  if (bounds > LIMITS.bounds) {
    issue(ctx, [...base, 'nutrients'], `the formula has ${bounds} nutrient, ratio and group bounds; the limit is ${LIMITS.bounds}`);
  }
  const ingredientIds = new Set<string>();
  const known = new Set<string>();
  p.ingredients.forEach((ing, i) => {
    const path = [...base, 'ingredients', i];
    if (ingredientIds.has(ing.id)) issue(ctx, [...path, 'id'], `duplicate ingredient id "${ing.id}"`);
    ingredientIds.add(ing.id);
    for (const k of Object.keys(ing.nutrients)) known.add(k);
    if (ing.fixedKg !== undefined) {
      for (const k of ['minKg', 'maxKg', 'minPercent', 'maxPercent'] as const) {
        if (ing[k] !== undefined) issue(ctx, [...path, k], `cannot be combined with fixedKg`);
      }
    }
    if (ing.minKg !== undefined && ing.minPercent !== undefined) issue(ctx, [...path, 'minPercent'], 'give minKg or minPercent, not both');
    if (ing.maxKg !== undefined && ing.maxPercent !== undefined) issue(ctx, [...path, 'maxPercent'], 'give maxKg or maxPercent, not both');
    checkMinMax(ctx, path, ing.minKg, ing.maxKg, 'minKg', 'maxKg');
    checkMinMax(ctx, path, ing.minPercent, ing.maxPercent, 'minPercent', 'maxPercent');
  });
  const nutrientIds = new Set<string>();
  p.nutrients.forEach((n, i) => {
    const path = [...base, 'nutrients', i];
    if (nutrientIds.has(n.id)) issue(ctx, [...path, 'id'], `duplicate nutrient id "${n.id}"`);
    nutrientIds.add(n.id);
    known.add(n.id);
    checkMinMax(ctx, path, n.min, n.max);
  });
  const ratioIds = new Set<string>();
  p.ratios.forEach((r, i) => {
    const path = [...base, 'ratios', i];
    const id = r.id ?? `${r.numerator}:${r.denominator}`;
    if (ratioIds.has(id)) issue(ctx, [...path, 'id'], `duplicate ratio id "${id}"`);
    ratioIds.add(id);
    if (!known.has(r.numerator)) issue(ctx, [...path, 'numerator'], `unknown nutrient id "${r.numerator}"`);
    if (!known.has(r.denominator)) issue(ctx, [...path, 'denominator'], `unknown nutrient id "${r.denominator}"`);
    if (r.numerator === r.denominator) issue(ctx, [...path, 'denominator'], 'must differ from the numerator');
    if (r.min === undefined && r.max === undefined) issue(ctx, [...path, 'min'], 'a ratio needs a min or a max');
    checkMinMax(ctx, path, r.min, r.max);
  });
  const groupIds = new Set<string>();
  p.groups.forEach((g, i) => {
    const path = [...base, 'groups', i];
    if (groupIds.has(g.id)) issue(ctx, [...path, 'id'], `duplicate group id "${g.id}"`);
    groupIds.add(g.id);
    const seen = new Set<string>();
    g.members.forEach((m, k) => {
      if (!ingredientIds.has(m)) issue(ctx, [...path, 'members', k], `unknown ingredient id "${m}"`);
      if (seen.has(m)) issue(ctx, [...path, 'members', k], `"${m}" is listed twice`);
      seen.add(m);
    });
    if (g.minKg !== undefined && g.minPercent !== undefined) issue(ctx, [...path, 'minPercent'], 'give minKg or minPercent, not both');
    if (g.maxKg !== undefined && g.maxPercent !== undefined) issue(ctx, [...path, 'maxPercent'], 'give maxKg or maxPercent, not both');
    checkMinMax(ctx, path, g.minKg, g.maxKg, 'minKg', 'maxKg');
    checkMinMax(ctx, path, g.minPercent, g.maxPercent, 'minPercent', 'maxPercent');
  });
}

/** A single least-cost formulation problem (`POST /api/solve`, the command line's default). */
export const formulaProblemSchema = z.strictObject(formulaShape).superRefine((p, ctx) => checkFormula(p, ctx));
export type FormulaProblem = z.infer<typeof formulaProblemSchema>;
/** Input type (before defaults): what a caller may pass. */
export type FormulaProblemInput = z.input<typeof formulaProblemSchema>;
export type Ingredient = z.infer<typeof ingredientSchema>;
export type NutrientBound = z.infer<typeof nutrientBoundSchema>;
export type RatioBound = z.infer<typeof ratioBoundSchema>;
export type GroupBound = z.infer<typeof groupBoundSchema>;
export type SolveOptions = z.infer<typeof solveOptionsSchema>;

/** One line of a given mix: kg or percent (exactly one). */
export const mixEntrySchema = z
  .strictObject({ id: idSchema, kg: kgSchema.optional(), percent: percentSchema.optional() })
  .refine((e) => (e.kg === undefined) !== (e.percent === undefined), { message: 'give kg or percent (exactly one)' });

/**
 * Evaluate a given mix without optimising (`POST /api/solve/evaluate`): the formula
 * fields (batchKg optional; defaults to the total of the mix) plus `mix`.
 */
export const evaluationProblemSchema = z
  .strictObject({
    ...formulaShape,
    batchKg: formulaShape.batchKg.optional(),
    mix: z.array(mixEntrySchema).min(1, 'needs at least one line').max(LIMITS.mixEntries),
  })
  .superRefine((p, ctx) => {
    checkFormula(p, ctx);
    const ids = new Set(p.ingredients.map((i) => i.id));
    const seen = new Set<string>();
    p.mix.forEach((e, i) => {
      if (!ids.has(e.id)) issue(ctx, ['mix', i, 'id'], `unknown ingredient id "${e.id}"`);
      if (seen.has(e.id)) issue(ctx, ['mix', i, 'id'], `"${e.id}" is listed twice`);
      seen.add(e.id);
    });
    const usesPercent = p.mix.some((e) => e.percent !== undefined);
    if (usesPercent && p.mix.some((e) => e.kg !== undefined)) issue(ctx, ['mix'], 'use kg or percent for every line, not a mixture');
    if (usesPercent && p.batchKg === undefined) issue(ctx, ['batchKg'], 'needed when the mix is given in percent');
    if (!usesPercent && p.mix.every((e) => (e.kg ?? 0) === 0)) issue(ctx, ['mix'], 'the mix weighs 0 kg');
  });
export type EvaluationProblem = z.infer<typeof evaluationProblemSchema>;

/** A formula's use of a library ingredient in an allocation: id plus optional overrides. */
export const ingredientUseSchema = z.strictObject({
  id: idSchema,
  pricePerKg: z.number().min(0, 'price must not be negative').max(1e9).optional(),
  minKg: kgSchema.optional(),
  maxKg: kgSchema.optional(),
  fixedKg: kgSchema.optional(),
  minPercent: percentSchema.optional(),
  maxPercent: percentSchema.optional(),
});

/** One formula of an allocation: how much to make and its specification. */
export const allocationFormulaSchema = z.strictObject({
  id: idSchema,
  name: nameSchema,
  /** Amount of this formula to make in the period, kg; > 0. */
  batchKg: formulaShape.batchKg,
  /** Library ingredients this formula may use (default: all), with per-formula limits. */
  ingredients: z.array(ingredientUseSchema).max(LIMITS.ingredients).optional(),
  nutrients: formulaShape.nutrients,
  ratios: formulaShape.ratios,
  groups: formulaShape.groups,
});

/**
 * Several formulas made from shared, limited stocks (`POST /api/solve/allocate`).
 * `ingredients` is the shared library; its `stockKg` is the stock shared by all formulas.
 */
export const allocationProblemSchema = z
  .strictObject({
    name: nameSchema,
    currency: formulaShape.currency,
    ingredients: formulaShape.ingredients,
    formulas: z
      .array(allocationFormulaSchema)
      .min(1, 'needs at least one formula')
      .max(LIMITS.formulas, `at most ${LIMITS.formulas} formulas (problem size limit)`),
    options: solveOptionsSchema.optional(),
  })
  .superRefine((p, ctx) => {
    const lib = new Map(p.ingredients.map((i) => [i.id, i]));
    const libIds = new Set<string>();
    p.ingredients.forEach((ing, i) => {
      if (libIds.has(ing.id)) issue(ctx, ['ingredients', i, 'id'], `duplicate ingredient id "${ing.id}"`);
      libIds.add(ing.id);
      for (const k of ['minKg', 'maxKg', 'fixedKg', 'minPercent', 'maxPercent'] as const) {
        if (ing[k] !== undefined) issue(ctx, ['ingredients', i, k], 'set inclusion limits per formula (formulas[].ingredients); the library carries price, nutrients and stockKg');
      }
    });
    let columns = 0;
    const formulaIds = new Set<string>();
    p.formulas.forEach((f, fi) => {
      if (formulaIds.has(f.id)) issue(ctx, ['formulas', fi, 'id'], `duplicate formula id "${f.id}"`);
      formulaIds.add(f.id);
      (f.ingredients ?? []).forEach((u, ui) => {
        if (!lib.has(u.id)) issue(ctx, ['formulas', fi, 'ingredients', ui, 'id'], `unknown ingredient id "${u.id}"`);
      });
      const resolved = resolveAllocationFormula(p, fi);
      columns += resolved.ingredients.length;
      checkFormula(resolved, ctx, ['formulas', fi]);
    });
    if (columns > LIMITS.allocationColumns) {
      issue(ctx, ['formulas'], `the allocation has ${columns} ingredient columns over all formulas; the limit is ${LIMITS.allocationColumns}`);
    }
  });
export type AllocationProblem = z.infer<typeof allocationProblemSchema>;
export type AllocationFormula = z.infer<typeof allocationFormulaSchema>;

/**
 * The formula problem that formula `index` of an allocation stands for: library
 * ingredients merged with the formula's overrides (stock is left out: it is shared).
 */
export function resolveAllocationFormula(p: Pick<AllocationProblem, 'ingredients' | 'formulas'>, index: number): FormulaProblem {
  const f = p.formulas[index];
  const lib = new Map(p.ingredients.map((i) => [i.id, i]));
  const uses = f.ingredients ?? p.ingredients.map((i) => ({ id: i.id }));
  const ingredients: Ingredient[] = [];
  for (const u of uses) {
    const base = lib.get(u.id);
    if (!base) continue;
    const { stockKg: _shared, ...rest } = base;
    const merged: Ingredient = { ...rest };
    for (const [k, v] of Object.entries(u)) if (v !== undefined) (merged as Record<string, unknown>)[k] = v;
    ingredients.push(merged);
  }
  return { batchKg: f.batchKg, ingredients, nutrients: f.nutrients, ratios: f.ratios, groups: f.groups, name: f.name };
}

/** What is an ingredient worth: re-solve over a range of its price (`POST /api/solve/price-sweep`). */
export const priceSweepSchema = z
  .strictObject({
    problem: formulaProblemSchema,
    /** Id of the ingredient whose price is swept. */
    ingredient: idSchema,
    fromPrice: z.number().min(0, 'must not be negative').max(1e9),
    toPrice: z.number().min(0, 'must not be negative').max(1e9),
    /** Number of prices, evenly spaced, both ends included (default 21). */
    steps: z.number().int().min(2).max(LIMITS.sweepSteps).optional(),
  })
  .superRefine((p, ctx) => {
    if (!p.problem.ingredients.some((i) => i.id === p.ingredient)) issue(ctx, ['ingredient'], `unknown ingredient id "${p.ingredient}"`);
    if (p.toPrice <= p.fromPrice) issue(ctx, ['toPrice'], 'must be above fromPrice');
  });
export type PriceSweepProblem = z.infer<typeof priceSweepSchema>;

// ---------------------------------------------------------------------------
// Results (produced by the engine; see src/shared/engine/README.md)
// ---------------------------------------------------------------------------

/** A field-level input error; `field` is a path such as `ratios[2].numerator`. */
export interface FieldError {
  field: string;
  message: string;
}

/** Bad input: nothing was solved. */
export interface InvalidResult {
  status: 'invalid';
  message: string;
  errors: FieldError[];
}

/** Which side of a bound is active: 'min', 'max', or null when the bound does not bind. */
export type BindingSide = 'min' | 'max' | null;

/** One line of the finished mix. */
export interface MixLine {
  id: string;
  name?: string;
  kg: number;
  /** Share of the batch, %. */
  percent: number;
  pricePerKg: number;
  /** Cost of this line in the batch. */
  cost: number;
}

/** Shadow price in the units a nutritionist reads. */
export interface ReadablePrice {
  /** Size of the step, in the bound's unit (e.g. 0.1 for "0.1 %"). */
  step: number;
  unit: string;
  /** Change in cost per tonne of finished feed when the bound moves up by one step. */
  costPerTonne: number;
  text: string;
}

export interface NutrientReport {
  id: string;
  name?: string;
  unit?: string;
  value: number;
  min: number | null;
  max: number | null;
  binding: BindingSide;
  /** Change in cost per batch when the active bound rises by 1 unit (0 when not binding). */
  shadowPrice: number;
  /** Same, per tonne of finished feed. */
  shadowPricePerTonne: number;
  readable?: ReadablePrice;
}

export interface RatioReport {
  id: string;
  numerator: string;
  denominator: string;
  factor: number;
  /** factor × numerator level / denominator level; null when the denominator level is 0. */
  value: number | null;
  min: number | null;
  max: number | null;
  binding: BindingSide;
  /** Change in cost per batch when the active ratio bound rises by 1 (ratio units). */
  shadowPrice: number;
  shadowPricePerTonne: number;
}

export interface GroupReport {
  id: string;
  name?: string;
  kg: number;
  percent: number;
  minKg: number | null;
  maxKg: number | null;
  binding: BindingSide;
  /** Change in cost per batch per kg the active limit rises. */
  shadowPrice: number;
  /** Change in cost per tonne of feed per 1 % of the mix the active limit rises. */
  shadowPricePerTonnePerPercent: number;
}

export interface InclusionReport {
  id: string;
  kg: number;
  minKg: number | null;
  maxKg: number | null;
  fixedKg: number | null;
  stockKg: number | null;
  /** 'min', 'max' (including a stock or fixed amount acting as the limit) or null. */
  binding: BindingSide;
  /** What sets the active upper limit: 'maxKg', 'maxPercent', 'stockKg' or 'fixedKg'. */
  limitedBy: string | null;
  /** Change in cost per batch per kg the active limit rises. */
  shadowPrice: number;
  shadowPricePerTonnePerPercent: number;
}

/** Price ranging for one ingredient (currency per kg; null = no limit). */
export type RangingReport =
  | { id: string; inMix: true; pricePerKg: number; lowPrice: number | null; highPrice: number | null }
  | {
      id: string;
      inMix: false;
      pricePerKg: number;
      /** Price at or below which it would enter the mix; null when its limits keep it out at any price. */
      entersAtPrice: number | null;
    }
  | { id: string; inMix: true; fixed: true; pricePerKg: number; lowPrice: null; highPrice: null };

/** How the answer was checked. */
export interface SolutionCheck {
  solver: string;
  /** Largest bound violation found, relative to its row's largest coefficient. */
  maxViolation: number;
  tolerance: number;
}

/** What every solved formula reports, alone or in an allocation: batch (kg), costs per kg, tonne and batch, mix and levels. */
export interface SolvedFormulaFields {
  batchKg: number;
  costPerKg: number;
  costPerTonne: number;
  costPerBatch: number;
  mix: MixLine[];
  nutrients: NutrientReport[];
  ratios: RatioReport[];
  groups: GroupReport[];
}

export interface OptimalResult extends SolvedFormulaFields {
  status: 'optimal';
  name?: string;
  currency?: string;
  inclusions: InclusionReport[];
  /** Empty when options.sensitivity is false. */
  ranging: RangingReport[];
  /** False when another mix has the same cost (shadow prices then still hold; the mix is one of several). */
  uniqueMix: boolean;
  check: SolutionCheck;
  warnings: string[];
}

/** One bound that must move for a mix to exist. */
export interface Relaxation {
  /** e.g. `nutrients[cp].min`, `ratios[ca:avp].max`, `groups[insect].maxKg`, `ingredients[fish].minKg`. */
  constraint: string;
  kind: 'nutrient' | 'ratio' | 'group' | 'ingredient' | 'stock';
  id: string;
  side: 'min' | 'max';
  bound: number;
  /** Level the closest mix reaches. */
  reaches: number;
  /** How far the bound must move (positive; down for a min, up for a max). */
  by: number;
  message: string;
}

export interface InfeasibleResult {
  status: 'infeasible';
  message: string;
  /** Cheapest set of bound moves that makes a mix possible (empty when diagnosis was off or failed). */
  relaxations: Relaxation[];
  /** Bounds that together cannot be met (the relaxed ones plus those they conflict with). */
  conflict: string[];
  /** The least-cost mix meeting the relaxed bounds. It does NOT meet the specification. */
  closestMix?: { costPerBatch: number; mix: MixLine[]; nutrients: NutrientReport[] };
}

export interface UnboundedResult {
  status: 'unbounded';
  message: string;
}

/** The solver failed or its answer did not pass the bound check: no mix is reported. */
export interface FailedResult {
  status: 'failed';
  message: string;
}

export type FormulaResult = OptimalResult | InfeasibleResult | UnboundedResult | InvalidResult | FailedResult;

/** A bound the evaluated mix misses. */
export interface Miss {
  constraint: string;
  bound: number;
  value: number;
  /** Shortfall below a min or excess above a max (positive). */
  by: number;
  message: string;
}

export interface EvaluationResult {
  status: 'evaluated';
  batchKg: number;
  totalKg: number;
  costPerKg: number;
  costPerTonne: number;
  costPerBatch: number;
  meetsSpecification: boolean;
  mix: MixLine[];
  nutrients: NutrientReport[];
  ratios: RatioReport[];
  groups: GroupReport[];
  misses: Miss[];
}

export interface StockReport {
  id: string;
  availableKg: number;
  usedKg: number;
  binding: boolean;
  /** How much total cost falls per extra tonne of this stock (>= 0). */
  valuePerTonne: number;
}

export interface AllocatedFormula extends SolvedFormulaFields {
  id: string;
  name?: string;
}

export interface AllocationOptimal {
  status: 'optimal';
  totalCost: number;
  formulas: AllocatedFormula[];
  stocks: StockReport[];
  check: SolutionCheck;
}

export interface AllocationInfeasible {
  status: 'infeasible';
  message: string;
  /** Formula that cannot be made even alone, when that is the cause. */
  formula?: string;
  relaxations: Relaxation[];
}

export type AllocationResult = AllocationOptimal | AllocationInfeasible | InvalidResult | FailedResult | UnboundedResult;

export interface SweepPoint {
  pricePerKg: number;
  status: FormulaResult['status'];
  costPerBatch: number | null;
  kg: number | null;
  percent: number | null;
}

/**
 * Where a swept ingredient stands against the range of prices swept (currency per kg as fed). Every
 * price here is exact (from ranging, confirmed by re-solving just above and just below), not read off
 * the grid of points.
 *
 * - `enters_in_range`: left out above `price` and used at `price` or less, with `price` between
 *   `fromPrice` and `toPrice`.
 * - `never_in_range`: left out at every price swept. `entersAtPrice` is the price, below `fromPrice`,
 *   at or below which it would enter (below 0: not even free); null when its limits (a maximum or
 *   stock of 0) or the specification keep it out at any price.
 * - `in_throughout_range`: used at every price swept; left out only above `leavesAbovePrice`, which is
 *   above `toPrice`.
 * - `always_in`: used at any price, however high: never less than `leastKg` (`leastPercent` of the
 *   batch). `reason`: `fixed` (a fixed amount), `minimum` (its minimum inclusion) or `required` (the
 *   specification cannot be met with less). `risesAbovePrice`: the price at or below which more
 *   than that least amount is used; null when its price cannot change its amount (fixed, or pinned).
 * - `no_mix`: no mix meets the specification at any price, so there is nothing to enter.
 * - `failed`: the solver could not settle it; `message` says what failed. No price is guessed.
 */
export type PriceSweepEntry =
  | { kind: 'enters_in_range'; price: number }
  | { kind: 'never_in_range'; entersAtPrice: number | null }
  | { kind: 'in_throughout_range'; leavesAbovePrice: number }
  | { kind: 'always_in'; reason: 'fixed' | 'minimum' | 'required'; leastKg: number; leastPercent: number; risesAbovePrice: number | null }
  | { kind: 'no_mix' }
  | { kind: 'failed'; message: string };

export interface PriceSweepResult {
  status: 'swept';
  ingredient: string;
  /** The range swept, currency per kg. */
  fromPrice: number;
  toPrice: number;
  points: SweepPoint[];
  /** The same at the ingredient's own price in the problem (today's price). */
  current: SweepPoint;
  /** Where the ingredient stands against the range: see {@link PriceSweepEntry}. */
  entry: PriceSweepEntry;
  /** Prices where the inclusion changes, from exact ranging between the sweep ends. */
  breakpoints: number[];
}

export type PriceSweepOutcome = PriceSweepResult | InvalidResult;
