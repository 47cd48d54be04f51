/**
 * From a formula's inputs and the library to the engine's problem, and back to words. Pure: the server
 * calls it with rows it read, the tests with plain objects.
 *
 * Units: everything per kg of feed as fed. Inclusion limits and caps are % of the batch, prices currency
 * per kg, nutrient bounds and ingredient values in the catalogue unit of each nutrient.
 */
import { checkInsectSubstrate } from './insect-rule';
import { INGREDIENT_CATEGORY_LABELS, INSECT_SPECIES_LABELS, type IngredientCategory, type InsectSpecies, type OriginAnimal, type SpeciesFamily, type SubstrateOrigin } from './library-terms';
import type { FormulaProblemInput, FormulaResult, GroupBound, NutrientBound, RatioBound } from './schemas/formulation';
import type {
  CapWarning,
  FormulaGroupInput,
  FormulaIngredientInput,
  FormulaInputs,
  FormulaSolve,
  NutrientInfo,
  UsedIngredient,
  VersionComparison,
} from './schemas/formulas';

/** A library ingredient as the builder needs it: identity, insect details for the rule, price, values per kg as fed. */
export type LibraryIngredient = {
  id: number;
  name: string;
  category: IngredientCategory;
  insectSpecies: InsectSpecies | null;
  substrate: string | null;
  substrateOrigin: SubstrateOrigin | null;
  substrateAnimals: readonly OriginAnimal[] | null;
  /** Current library price, currency per kg as fed; null when none was ever set. */
  pricePerKg: number | null;
  priceDate: string | null;
  version: number;
  /** Nutrient id → value per kg as fed. */
  values: Record<string, number>;
};

/** The parts of a requirement specification that fill a new formula. Caps are % of the feed. */
export type SpecificationBounds = {
  bounds: { nutrientId: string; min: number | null; max: number | null }[];
  ratios: { numeratorId: string; denominatorId: string; min: number | null; max: number | null }[];
  caps: {
    scope: 'ingredient' | 'category' | 'insect_species';
    ingredientId: number | null;
    category: IngredientCategory | null;
    insectSpecies: InsectSpecies | null;
    minPct: number | null;
    maxPct: number | null;
    /** A tested level from a feeding trial: exceeding it warns, never blocks. */
    soft: boolean;
    source: string;
  }[];
};

/**
 * The inputs of a new formula from a specification: its nutrient and ratio bounds, its category and
 * insect caps as groups (a soft cap's level is kept as `testedMaxPct`), and its per-ingredient caps
 * on the chosen ingredients that carry no limit of their own.
 * @param batchKg batch size, kg as fed
 */
export function inputsFromSpecification(spec: SpecificationBounds, ingredients: FormulaIngredientInput[], batchKg: number): FormulaInputs {
  const capsByIngredient = new Map(spec.caps.filter((c) => c.scope === 'ingredient' && c.ingredientId).map((c) => [c.ingredientId!, c]));
  return {
    batchKg,
    ingredients: ingredients.map((i) => {
      const cap = capsByIngredient.get(i.ingredientId);
      if (!cap || i.minPct != null || i.maxPct != null) return i;
      return { ...i, minPct: cap.minPct, maxPct: cap.maxPct };
    }),
    nutrients: spec.bounds.map((b) => ({ nutrientId: b.nutrientId, min: b.min, max: b.max })),
    ratios: spec.ratios.map((r) => ({ numeratorId: r.numeratorId, denominatorId: r.denominatorId, min: r.min, max: r.max })),
    groups: spec.caps
      .filter((c) => c.scope !== 'ingredient')
      .map(
        (c): FormulaGroupInput => ({
          label: c.scope === 'category' ? `${INGREDIENT_CATEGORY_LABELS[c.category!]} in all` : `${INSECT_SPECIES_LABELS[c.insectSpecies!]} meals in all`,
          scope: c.scope as 'category' | 'insect_species',
          category: c.scope === 'category' ? c.category : null,
          insectSpecies: c.scope === 'insect_species' ? c.insectSpecies : null,
          minPct: c.minPct,
          maxPct: c.maxPct,
          testedMaxPct: c.soft ? c.maxPct : null,
          source: c.source,
        }),
      ),
  };
}

export type BuildContext = {
  /** The library rows of the chosen ingredients (others may be present). */
  library: ReadonlyMap<number, LibraryIngredient>;
  /** Catalogue names and units of the nutrients. */
  nutrients: ReadonlyMap<string, NutrientInfo>;
  /** The diet's species: the insect-protein rule is judged against its family. */
  species: { name: string; family: SpeciesFamily } | null;
  name?: string;
  currency?: string;
};

export type BuildOutcome =
  | { ok: true; problem: FormulaProblemInput; used: UsedIngredient[]; nutrients: NutrientInfo[] }
  | { ok: false; message: string; fieldErrors: Record<string, string[]> };

/** Engine ids of a formula's groups, by position in `inputs.groups`. */
export const groupId = (index: number) => `group-${index + 1}`;

/** Engine id of a library ingredient. */
export const ingredientKey = (ingredientId: number) => String(ingredientId);

const ratioId = (r: { numeratorId: string; denominatorId: string }) => `${r.numeratorId}:${r.denominatorId}`;

/**
 * Builds the engine problem. Refuses (never drops silently) an ingredient the library does not have,
 * one the insect-protein rule keeps out of this species' diets, one without any price, and a bound on a
 * nutrient the catalogue does not know; each refusal is a field error that says what to fix.
 */
export function buildFormulaProblem(inputs: FormulaInputs, ctx: BuildContext): BuildOutcome {
  const fieldErrors: Record<string, string[]> = {};
  const fail = (path: string, message: string) => (fieldErrors[path] ??= []).push(message);
  const used: UsedIngredient[] = [];

  inputs.ingredients.forEach((choice, k) => {
    const row = ctx.library.get(choice.ingredientId);
    if (!row) return fail(`ingredients[${k}].ingredientId`, `no ingredient with id ${choice.ingredientId} in your library`);
    if (ctx.species) {
      const verdict = checkInsectSubstrate(row, ctx.species.family, ctx.species.name);
      if (!verdict.allowed) return fail(`ingredients[${k}].ingredientId`, verdict.message);
    }
    const entered = choice.pricePerKg ?? null;
    const price = entered ?? row.pricePerKg;
    if (price === null) return fail(`ingredients[${k}].pricePerKg`, `${row.name} has no price in the library: enter today’s price per kg`);
    used.push({
      ingredientId: row.id,
      name: row.name,
      category: row.category,
      insectSpecies: row.insectSpecies,
      libraryVersion: row.version,
      pricePerKg: price,
      priceSource: entered !== null ? 'entered' : 'library',
      libraryPricePerKg: row.pricePerKg,
      priceDate: row.priceDate,
      values: { ...row.values },
    });
  });

  const info = (id: string): NutrientInfo | undefined => ctx.nutrients.get(id);
  inputs.nutrients.forEach((b, k) => {
    if (!info(b.nutrientId)) fail(`nutrients[${k}].nutrientId`, `“${b.nutrientId}” is not a nutrient in the catalogue`);
  });
  inputs.ratios.forEach((r, k) => {
    if (!info(r.numeratorId)) fail(`ratios[${k}].numeratorId`, `“${r.numeratorId}” is not a nutrient in the catalogue`);
    if (!info(r.denominatorId)) fail(`ratios[${k}].denominatorId`, `“${r.denominatorId}” is not a nutrient in the catalogue`);
  });

  const first = Object.entries(fieldErrors)[0];
  if (first) return { ok: false, message: `${first[0]}: ${first[1][0]}`, fieldErrors };

  // Only the nutrients the bounds and ratios name go to the engine; the snapshot keeps every value.
  const wanted = new Set<string>([...inputs.nutrients.map((b) => b.nutrientId), ...inputs.ratios.flatMap((r) => [r.numeratorId, r.denominatorId])]);
  const nutrientBounds: NutrientBound[] = inputs.nutrients.map((b) => {
    const n = info(b.nutrientId)!;
    return { id: n.id, name: n.name, unit: n.unit, ...(b.min != null ? { min: b.min } : {}), ...(b.max != null ? { max: b.max } : {}) };
  });
  for (const id of wanted) {
    if (!inputs.nutrients.some((b) => b.nutrientId === id)) {
      const n = info(id)!;
      nutrientBounds.push({ id, name: n.name, unit: n.unit });
    }
  }
  const ratios: RatioBound[] = inputs.ratios.map((r) => ({
    id: ratioId(r),
    name: `${info(r.numeratorId)!.name} : ${info(r.denominatorId)!.name}`,
    numerator: r.numeratorId,
    denominator: r.denominatorId,
    ...(r.min != null ? { min: r.min } : {}),
    ...(r.max != null ? { max: r.max } : {}),
  }));
  const groups: GroupBound[] = [];
  inputs.groups.forEach((g, k) => {
    const members = used.filter((u) => (g.scope === 'category' ? u.category === g.category : u.insectSpecies === g.insectSpecies)).map((u) => ingredientKey(u.ingredientId));
    if (members.length === 0 || (g.minPct == null && g.maxPct == null)) return;
    groups.push({ id: groupId(k), name: g.label, members, ...(g.minPct != null ? { minPercent: g.minPct } : {}), ...(g.maxPct != null ? { maxPercent: g.maxPct } : {}) });
  });

  const byId = new Map(inputs.ingredients.map((i) => [i.ingredientId, i]));
  const problem: FormulaProblemInput = {
    ...(ctx.name ? { name: ctx.name } : {}),
    ...(ctx.currency ? { currency: ctx.currency } : {}),
    batchKg: inputs.batchKg,
    ingredients: used.map((u) => {
      const choice = byId.get(u.ingredientId)!;
      const nutrients = Object.fromEntries(Object.entries(u.values).filter(([id]) => wanted.has(id)));
      return {
        id: ingredientKey(u.ingredientId),
        name: u.name,
        pricePerKg: u.pricePerKg,
        ...(choice.minPct != null ? { minPercent: choice.minPct } : {}),
        ...(choice.maxPct != null ? { maxPercent: choice.maxPct } : {}),
        nutrients,
      };
    }),
    nutrients: nutrientBounds,
    ratios,
    groups,
  };
  const nutrients = [...wanted].map((id) => info(id)!);
  return { ok: true, problem, used, nutrients };
}

/**
 * Soft caps the mix goes past: a group whose share of the batch is above the level a feeding trial
 * tested. A warning only; the planner may have raised the cap on purpose.
 */
export function capWarnings(inputs: FormulaInputs, result: FormulaResult): CapWarning[] {
  if (result.status !== 'optimal') return [];
  const out: CapWarning[] = [];
  inputs.groups.forEach((g, k) => {
    if (g.testedMaxPct == null) return;
    const report = result.groups.find((r) => r.id === groupId(k));
    if (!report || report.percent <= g.testedMaxPct + 1e-9) return;
    out.push({
      label: g.label,
      percent: report.percent,
      testedMaxPct: g.testedMaxPct,
      source: g.source ?? null,
      message: `${g.label}: ${round(report.percent, 2)} % of the feed, above the ${g.testedMaxPct} % tested in feeding trials${g.source ? ` (${g.source})` : ''}. Check before feeding.`,
    });
  });
  return out;
}

function round(value: number, places: number): number {
  const f = 10 ** places;
  return Math.round(value * f) / f;
}

/** Mix, cost and nutrient differences between two solves, b minus a (percent points, currency per tonne, nutrient units). */
export function compareSolves(a: FormulaSolve, b: FormulaSolve): Omit<VersionComparison, 'a' | 'b'> {
  const mixOf = (s: FormulaSolve) => (s.result.status === 'optimal' ? s.result.mix : []);
  const costOf = (s: FormulaSolve) => (s.result.status === 'optimal' ? s.result.costPerTonne : null);
  const levelsOf = (s: FormulaSolve) => new Map(s.result.status === 'optimal' ? s.result.nutrients.map((n) => [n.id, n.value]) : []);
  const names = new Map<string, string>();
  for (const s of [a, b]) for (const u of s.ingredients) names.set(ingredientKey(u.ingredientId), u.name);
  const aMix = new Map(mixOf(a).map((m) => [m.id, m.percent]));
  const bMix = new Map(mixOf(b).map((m) => [m.id, m.percent]));
  const ids = [...new Set([...aMix.keys(), ...bMix.keys()])];
  const mix = ids
    .map((id) => {
      const ap = aMix.get(id) ?? 0;
      const bp = bMix.get(id) ?? 0;
      return { id, name: names.get(id) ?? id, aPercent: ap, bPercent: bp, diffPercent: bp - ap };
    })
    .sort((x, y) => Math.max(y.aPercent, y.bPercent) - Math.max(x.aPercent, x.bPercent));
  const aLevels = levelsOf(a);
  const bLevels = levelsOf(b);
  const infos = new Map<string, NutrientInfo>();
  for (const s of [a, b]) for (const n of s.nutrients) infos.set(n.id, n);
  const nutrients = [...infos.values()].map((n) => {
    const av = aLevels.get(n.id) ?? null;
    const bv = bLevels.get(n.id) ?? null;
    return { id: n.id, name: n.name, unit: n.unit, a: av, b: bv, diff: av !== null && bv !== null ? bv - av : null };
  });
  const ac = costOf(a);
  const bc = costOf(b);
  return { cost: { aPerTonne: ac, bPerTonne: bc, diffPerTonne: ac !== null && bc !== null ? bc - ac : null }, mix, nutrients };
}
