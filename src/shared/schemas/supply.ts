/**
 * Contracts of the insect supply API (/api/supply-plans). zod validates on the server and in tests; the
 * client imports only the types from this file.
 *
 * Units: tonnes per week for streams and formulas, kg per week for results, % for moisture and composition,
 * currency per kg as fed for prices, t/ha for the soybean yield.
 */
import { z } from 'zod';

import type { AllocationResult } from './formulation';
import { ORIGIN_ANIMAL_CODES, type OriginAnimal, type SpeciesFamily } from '../library-terms';
import type { SubstrateFlag } from '../supply/rules';
import type { LandUseResult } from '../supply/land-use';
import type { SupplyPlanResult } from '../supply/plan';
import { SUBSTRATE_KINDS, SUBSTRATES, type SubstrateKind } from '../supply/substrates';

const pct = (what: string, max = 100) =>
  z.number({ message: `enter ${what} as a number` }).min(0, `${what} cannot be negative`).max(max, `${what} must be at most ${max} %`).nullish();

export const supplyStreamInput = z
  .strictObject({
    name: z.string().trim().min(1, 'name the stream').max(160, 'at most 160 characters'),
    substrate: z.enum(SUBSTRATE_KINDS, { message: `choose a substrate: ${SUBSTRATE_KINDS.join(', ')}` }),
    tonnesPerWeek: z.number({ message: 'enter tonnes per week' }).min(0, 'tonnes per week cannot be negative').max(100_000, 'at most 100,000 t per week'),
    moisturePct: pct('moisture', 99),
    substrateCpDmPct: pct('substrate protein'),
    bioconversionDmPct: pct('bioconversion'),
    residueDmPct: pct('residue'),
    larvaeDryMatterPct: z.number({ message: 'enter the larvae dry matter as a number' }).min(5, 'larvae dry matter must be at least 5 %').max(100, 'at most 100 %').nullish(),
    animals: z.array(z.enum(ORIGIN_ANIMAL_CODES)).max(ORIGIN_ANIMAL_CODES.length).nullish(),
  })
  .superRefine((s, ctx) => {
    const allowed = SUBSTRATES[s.substrate].animalChoices;
    for (const a of s.animals ?? []) {
      if (!allowed.includes(a)) ctx.addIssue({ code: 'custom', path: ['animals'], message: allowed.length ? `${SUBSTRATES[s.substrate].label} can only come from: ${allowed.join(', ')}` : `${SUBSTRATES[s.substrate].label} is of plant origin: leave the animals empty` });
    }
  });

const planFields = {
  name: z.string().trim().min(1, 'name the plan').max(160, 'at most 160 characters'),
  notes: z.string().max(2000, 'at most 2,000 characters').nullish(),
  streams: z.array(supplyStreamInput).min(1, 'add at least one stream').max(50, 'at most 50 streams'),
  defatted: z.boolean().default(false),
  residualFatPct: z.number().min(0, 'fat left cannot be negative').max(40, 'fat left in a pressed meal must be at most 40 %').nullish(),
  mealDryMatterPct: z.number().min(80, 'a dried meal has at least 80 % dry matter').max(100, 'at most 100 %').nullish(),
  residueMoisturePct: z.number().min(0, 'cannot be negative').max(90, 'at most 90 %').nullish(),
  mealIngredientId: z.number().int().positive('choose an insect meal from your library').nullish(),
  soybeanYieldTPerHa: z.number().gt(0, 'the soybean yield must be above 0 t/ha').max(10, 'a soybean yield above 10 t/ha is not credible').nullish(),
  soybeanYieldSource: z.string().trim().max(300, 'at most 300 characters').nullish(),
  soybeanCpPct: z.number().gt(0, 'soybean protein must be above 0 %').max(60, 'at most 60 %').nullish(),
  weeksPerYear: z.number().int('whole weeks').min(1, 'at least 1 week').max(53, 'at most 53 weeks').nullish(),
};

/** POST /api/supply-plans */
export const createSupplyPlanInput = z.strictObject(planFields);
export type CreateSupplyPlanInput = z.input<typeof createSupplyPlanInput>;

/** PUT /api/supply-plans/:id: the whole plan; a stale `expectedVersion` answers 409 and nothing is saved. */
export const updateSupplyPlanInput = z.strictObject({ ...planFields, expectedVersion: z.number().int().positive().optional() });
export type UpdateSupplyPlanInput = z.input<typeof updateSupplyPlanInput>;

/** POST /api/supply-plans/:id/allocate: the formulas to make this week and the ingredients they may use. */
export const allocateSupplyInput = z
  .strictObject({
    formulas: z
      .array(
        z.strictObject({
          specificationId: z.number({ message: 'choose a requirement specification' }).int().positive(),
          tonnesPerWeek: z.number({ message: 'enter tonnes per week' }).gt(0, 'make more than 0 t').max(100_000, 'at most 100,000 t per week'),
        }),
      )
      .min(1, 'add at least one formula')
      .max(20, 'at most 20 formulas'),
    ingredients: z
      .array(
        z.strictObject({
          ingredientId: z.number({ message: 'choose an ingredient' }).int().positive(),
          pricePerKg: z.number().min(0, 'a price cannot be negative').max(1_000_000).nullish(),
        }),
      )
      .min(1, 'choose at least one ingredient')
      .max(100, 'at most 100 ingredients'),
    /** What a kg of the farm's meal is counted at, currency per kg as fed (its cost, or what it would sell for). */
    mealPricePerKg: z.number({ message: 'enter the meal’s value per kg' }).min(0, 'cannot be negative').max(1_000_000),
  })
  .superRefine((v, ctx) => {
    const seen = new Set<number>();
    v.ingredients.forEach((i, k) => {
      if (seen.has(i.ingredientId)) ctx.addIssue({ code: 'custom', path: ['ingredients', k, 'ingredientId'], message: 'this ingredient is listed twice: keep one row' });
      seen.add(i.ingredientId);
    });
  });
export type AllocateSupplyInput = z.input<typeof allocateSupplyInput>;

export type SupplyStream = {
  id: number;
  name: string;
  substrate: SubstrateKind;
  tonnesPerWeek: number;
  moisturePct: number | null;
  substrateCpDmPct: number | null;
  bioconversionDmPct: number | null;
  residueDmPct: number | null;
  larvaeDryMatterPct: number | null;
  animals: OriginAnimal[] | null;
};

export type SupplyPlanSummary = {
  id: number;
  name: string;
  streamCount: number;
  tonnesPerWeek: number;
  defatted: boolean;
  version: number;
  updatedAt: string;
};

export type SupplyPlanDetail = SupplyPlanSummary & {
  notes: string | null;
  streams: SupplyStream[];
  residualFatPct: number | null;
  mealDryMatterPct: number | null;
  residueMoisturePct: number | null;
  mealIngredient: { id: number; name: string; labSource: string | null } | null;
  soybeanYieldTPerHa: number | null;
  soybeanYieldSource: string | null;
  soybeanCpPct: number | null;
  weeksPerYear: number | null;
  /** The computed week: mass balance, processing, composition. */
  plan: SupplyPlanResult;
  flags: SubstrateFlag[];
  /** The insect-protein rule on the planned meal. */
  speciesRule: { substrateAnimals: OriginAnimal[]; refused: { family: SpeciesFamily; message: string }[] };
  landUse: LandUseResult & { yieldSource: string };
};

/** One formula of the week's allocation, as the screen shows it. */
export type SupplyAllocationFormula = {
  specificationId: number;
  name: string;
  speciesName: string;
  family: SpeciesFamily;
  tonnesPerWeek: number;
  /** False when the insect-protein rule keeps the meal out of this diet; `refusal` says why. */
  mealOffered: boolean;
  refusal: string | null;
  /** Library insect meals left out of this diet by the same rule. */
  refusedIngredients: { ingredientId: number; name: string; message: string }[];
  mealKg: number;
  mealPercent: number;
  costPerTonne: number | null;
  costPerTonneWithoutMeal: number | null;
};

export type SupplyAllocationResponse = {
  /** The allocation with the planned meal, and the same one with its stock at 0. */
  status: AllocationResult['status'];
  statusWithoutMeal: AllocationResult['status'];
  message: string | null;
  mealAvailableKg: number;
  mealUsedKg: number;
  mealLeftKg: number;
  /** How much the week's total cost would fall with one more tonne of meal (0 when some is left over). */
  mealValuePerTonne: number | null;
  totalCost: number | null;
  totalCostWithoutMeal: number | null;
  /** totalCostWithoutMeal − totalCost; null when either side has no mix. */
  saving: number | null;
  formulas: SupplyAllocationFormula[];
  warnings: string[];
  result: AllocationResult;
  resultWithoutMeal: AllocationResult;
};

/** GET /api/supply-plans/allocation-options: what the allocation form can choose from. */
export type SupplyAllocationOptions = {
  specifications: { id: number; name: string; library: 'own' | 'reference'; speciesName: string; family: SpeciesFamily; phaseName: string | null }[];
  ingredients: { id: number; name: string; category: string; pricePerKg: number | null; refusedFamilies: SpeciesFamily[] }[];
  insectMeals: { id: number; name: string; hasLab: boolean }[];
};
