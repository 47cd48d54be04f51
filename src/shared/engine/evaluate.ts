/**
 * "Check my ration": levels, cost and missed bounds of a given mix, no optimising.
 */
import {
  evaluationProblemSchema,
  type EvaluationProblem,
  type EvaluationResult,
  type FormulaProblem,
  type InvalidResult,
  type Miss,
} from '../schemas/formulation';
import { fieldErrors, fmt, withUnit } from './format';
import { buildFormulaModel } from './formula-model';
import { reportMix } from './report';

/** Relative tolerance for calling a bound missed (of the bound's magnitude, at least 1e-9 absolute). */
const MISS_TOL = 1e-7;

function missed(value: number, bound: number): number {
  return Math.abs(value - bound) > MISS_TOL * Math.max(Math.abs(bound), 1e-2) + 1e-9 ? Math.abs(value - bound) : 0;
}

/**
 * Evaluate a given mix against a specification.
 *
 * @param input an evaluation problem (formula fields plus `mix: [{ id, kg } | { id, percent }]`;
 *   `batchKg` defaults to the mix total and is required for percent lines).
 * @returns `evaluated` with levels beside bounds, cost per kg / tonne / batch, `misses[]`
 *   (every bound missed, with the amount) and `meetsSpecification`; or `invalid` with
 *   field errors. Ingredient limits (min, max, fixed, stock) and the batch total are
 *   checked too. Never throws on bad input.
 */
export function evaluateMix(input: unknown): EvaluationResult | InvalidResult {
  const parsed = evaluationProblemSchema.safeParse(input);
  if (!parsed.success) {
    const errors = fieldErrors(parsed.error.issues);
    return { status: 'invalid', message: `${errors[0].field}: ${errors[0].message}`, errors };
  }
  const p: EvaluationProblem = parsed.data;
  const byId = new Map(p.mix.map((e) => [e.id, e]));
  const usesPercent = p.mix.some((e) => e.percent !== undefined);
  const totalGiven = usesPercent ? (p.batchKg as number) * p.mix.reduce((s, e) => s + (e.percent ?? 0), 0) / 100 : p.mix.reduce((s, e) => s + (e.kg ?? 0), 0);
  const batchKg = p.batchKg ?? totalGiven;
  const kgOf = (id: string) => {
    const e = byId.get(id);
    if (!e) return 0;
    return e.kg ?? ((e.percent ?? 0) / 100) * batchKg;
  };
  const totalKg = p.ingredients.reduce((s, ing) => s + kgOf(ing.id), 0);
  // Levels are per kg of the mix actually given (a mix that does not fill the batch is still judged on its own composition).
  const shares = p.ingredients.map((ing) => kgOf(ing.id) / totalKg);
  const formula: FormulaProblem = { ...p, batchKg: totalKg };
  const model = buildFormulaModel(formula);
  const rep = reportMix(model, shares, null, MISS_TOL);

  const misses: Miss[] = [];
  const add = (constraint: string, bound: number, value: number, by: number, message: string) => misses.push({ constraint, bound, value, by, message });
  if (missed(totalKg, batchKg) > 0) {
    add('batchKg', batchKg, totalKg, Math.abs(totalKg - batchKg), `The mix weighs ${fmt(totalKg)} kg, not the ${fmt(batchKg)} kg batch.`);
  }
  rep.nutrients.forEach((n) => {
    const label = n.name ?? n.id;
    if (n.min !== null && n.value < n.min && missed(n.value, n.min)) {
      add(`nutrients[${n.id}].min`, n.min, n.value, n.min - n.value, `${label} is ${withUnit(n.value, n.unit)}, below the min ${withUnit(n.min, n.unit)} by ${withUnit(n.min - n.value, n.unit)}.`);
    }
    if (n.max !== null && n.value > n.max && missed(n.value, n.max)) {
      add(`nutrients[${n.id}].max`, n.max, n.value, n.value - n.max, `${label} is ${withUnit(n.value, n.unit)}, above the max ${withUnit(n.max, n.unit)} by ${withUnit(n.value - n.max, n.unit)}.`);
    }
  });
  rep.ratios.forEach((r) => {
    if (r.value === null) {
      add(`ratios[${r.id}]`, r.min ?? r.max ?? 0, NaN, NaN, `${r.id}: the mix has no ${r.denominator}, so the ratio is undefined.`);
      return;
    }
    if (r.min !== null && r.value < r.min && missed(r.value, r.min)) add(`ratios[${r.id}].min`, r.min, r.value, r.min - r.value, `${r.id} is ${fmt(r.value)}, below the min ${fmt(r.min)}.`);
    if (r.max !== null && r.value > r.max && missed(r.value, r.max)) add(`ratios[${r.id}].max`, r.max, r.value, r.value - r.max, `${r.id} is ${fmt(r.value)}, above the max ${fmt(r.max)}.`);
  });
  // Group and inclusion limits in kg are judged on the kg given; limits in % on the share of the mix.
  rep.groups.forEach((g) => {
    const kg = g.kg;
    const minKg = g.minKg;
    const maxKg = g.maxKg;
    if (minKg !== null && kg < minKg && missed(kg, minKg)) add(`groups[${g.id}].minKg`, minKg, kg, minKg - kg, `Group ${g.name ?? g.id} has ${fmt(kg)} kg, below its min ${fmt(minKg)} kg.`);
    if (maxKg !== null && kg > maxKg && missed(kg, maxKg)) add(`groups[${g.id}].maxKg`, maxKg, kg, kg - maxKg, `Group ${g.name ?? g.id} has ${fmt(kg)} kg, above its max ${fmt(maxKg)} kg.`);
  });
  p.ingredients.forEach((ing, j) => {
    const kg = kgOf(ing.id);
    const lim = model.limits[j];
    const lo = lim.lowerKg;
    const up = lim.upperKg;
    const name = ing.name ?? ing.id;
    if (lim.fixed) {
      if (missed(kg, ing.fixedKg as number) > 0) add(`ingredients[${ing.id}].fixedKg`, ing.fixedKg as number, kg, Math.abs(kg - (ing.fixedKg as number)), `${name} is ${fmt(kg)} kg, not the fixed ${fmt(ing.fixedKg as number)} kg.`);
      return;
    }
    if (lo > 0 && kg < lo && missed(kg, lo)) add(`ingredients[${ing.id}].${lim.lowerSource}`, lo, kg, lo - kg, `${name} is ${fmt(kg)} kg, below its min ${fmt(lo)} kg.`);
    if (up !== Infinity && kg > up && missed(kg, up)) add(`ingredients[${ing.id}].${lim.upperSource}`, up, kg, kg - up, `${name} is ${fmt(kg)} kg, above its ${lim.upperSource === 'stockKg' ? 'stock' : 'max'} ${fmt(up)} kg.`);
  });

  return {
    status: 'evaluated',
    batchKg,
    totalKg,
    costPerKg: rep.costPerKg,
    costPerTonne: rep.costPerKg * 1000,
    costPerBatch: rep.costPerKg * totalKg,
    meetsSpecification: misses.length === 0,
    mix: rep.mix,
    nutrients: rep.nutrients,
    ratios: rep.ratios,
    groups: rep.groups,
    misses,
  };
}
