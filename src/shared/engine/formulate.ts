/**
 * Least-cost formulation of a single formula: solve, check, explain and price.
 */
import {
  formulaProblemSchema,
  type FormulaProblem,
  type FormulaResult,
  type InvalidResult,
  type OptimalResult,
  type RangingReport,
} from '../schemas/formulation';
import { diagnoseFormula } from './diagnose';
import { fieldErrors } from './format';
import { buildFormulaModel, type FormulaModel } from './formula-model';
import { maxScaledViolation, type LpOutcome, type LpSolver } from './lp-types';
import { reportMix, solvedFormulaFields } from './report';
import { simplexJs } from './simplex-js';

/** Default accepted violation of any bound, relative to the largest coefficient of its row. */
export const DEFAULT_TOLERANCE = 1e-7;

/** Engine options (all optional). */
export interface EngineOptions {
  /** LP solver for the formula (default: javascript-lp-solver). */
  solver?: LpSolver;
  /** Second solver tried when the first fails or its answer does not pass the bound check. */
  fallbackSolver?: LpSolver;
  /** Skip zod validation: the caller guarantees a parsed {@link FormulaProblem}. */
  trusted?: boolean;
}

/** Validate a formula problem; the parsed problem or an `invalid` result naming each field. */
export function parseFormulaProblem(input: unknown): { ok: true; problem: FormulaProblem } | { ok: false; result: InvalidResult } {
  const parsed = formulaProblemSchema.safeParse(input);
  if (parsed.success) return { ok: true, problem: parsed.data };
  const errors = fieldErrors(parsed.error.issues);
  return { ok: false, result: { status: 'invalid', message: `${errors[0].field}: ${errors[0].message}`, errors } };
}

/** Solve the LP of a model and check the answer; falls back to a second solver if given. */
export function solveChecked(
  model: FormulaModel,
  wantRanging: boolean,
  tolerance: number,
  options: EngineOptions,
): { outcome: LpOutcome; solver: string; violation: number; where: string | null } {
  const solvers = [options.solver ?? simplexJs, ...(options.fallbackSolver ? [options.fallbackSolver] : [])];
  let last: { outcome: LpOutcome; solver: string; violation: number; where: string | null } | null = null;
  for (const s of solvers) {
    const outcome = s.solve(model.lp, { costRanging: wantRanging });
    if (outcome.status !== 'optimal') {
      last = { outcome, solver: s.name, violation: 0, where: null };
      if (outcome.status === 'error') continue;
      return last;
    }
    const v = maxScaledViolation(model.lp, outcome.colValue);
    last = { outcome, solver: s.name, violation: v.violation, where: v.where };
    if (v.violation <= tolerance) return last;
  }
  return last as NonNullable<typeof last>;
}

/**
 * Find the least-cost mix for a formula problem and explain it.
 *
 * @param input a problem in the JSON format of src/shared/engine/README.md (validated here
 *   unless `options.trusted`).
 * @returns
 *  - `optimal`: the mix (kg and % of `batchKg`), cost per kg / tonne / batch, nutrient,
 *    ratio, group and inclusion levels beside their bounds with shadow prices, and price
 *    ranging for every ingredient (unless `options.sensitivity` is false). Every bound is
 *    met within `options.tolerance` (default 1e-7 of its row's largest coefficient).
 *  - `infeasible`: no mix exists; `relaxations` gives the cheapest set of bound moves,
 *    `conflict` the bounds involved, `closestMix` the mix meeting the relaxed bounds.
 *  - `invalid`: bad input, with `errors[]` naming each field (`ratios[2].numerator`).
 *  - `failed`: the solver's answer did not pass the bound check; no mix is reported.
 *  - `unbounded`: cannot happen for a formula (the batch is fixed) but is reported if a solver says so.
 * Never throws on bad input.
 */
export function solveFormula(input: unknown, options: EngineOptions = {}): FormulaResult {
  let problem: FormulaProblem;
  if (options.trusted) problem = input as FormulaProblem;
  else {
    const parsed = parseFormulaProblem(input);
    if (!parsed.ok) return parsed.result;
    problem = parsed.problem;
  }
  const model = buildFormulaModel(problem);
  return solveModel(model, options);
}

/** Solve an already built model (used by the price sweep to avoid rebuilding). */
export function solveModel(model: FormulaModel, options: EngineOptions = {}): FormulaResult {
  const problem = model.problem;
  const sensitivity = problem.options?.sensitivity !== false;
  const tolerance = problem.options?.tolerance ?? DEFAULT_TOLERANCE;
  const warnings = collectWarnings(model);

  const { outcome, solver, violation, where } = solveChecked(model, sensitivity, tolerance, options);

  if (outcome.status === 'infeasible') {
    if (problem.options?.diagnose === false) {
      return { status: 'infeasible', message: 'No mix meets the specification.', relaxations: [], conflict: [] };
    }
    const d = diagnoseFormula(model, options.solver ?? simplexJs);
    if (d.kind === 'infeasible') return d.result;
    return { status: 'failed', message: 'The solver reported no feasible mix, but the relaxation check found one; the answer is withheld. Try again or report the problem.' };
  }
  if (outcome.status === 'unbounded') return { status: 'unbounded', message: 'The cost can fall without limit; check for negative prices.' };
  if (outcome.status === 'error') return { status: 'failed', message: outcome.message };
  if (violation > tolerance) {
    return {
      status: 'failed',
      message: `The solver's mix breaks ${where ?? 'a bound'} by ${violation.toExponential(2)} (relative), above the tolerance ${tolerance}; no mix is reported.`,
    };
  }

  const B = problem.batchKg;
  const rep = reportMix(model, outcome.colValue, outcome, tolerance);
  const ranging: RangingReport[] = sensitivity ? rangingReport(model, outcome) : [];
  const result: OptimalResult = {
    status: 'optimal',
    ...(problem.name ? { name: problem.name } : {}),
    ...(problem.currency ? { currency: problem.currency } : {}),
    ...solvedFormulaFields(rep, B),
    inclusions: rep.inclusions,
    ranging,
    uniqueMix: !outcome.alternativeOptima,
    check: { solver, maxViolation: violation, tolerance },
    warnings,
  };
  return result;
}

function finiteOrNull(v: number | undefined): number | null {
  return v === undefined || !Number.isFinite(v) ? null : v;
}

/** Price ranging from the LP's cost ranging (currency per kg). */
export function rangingReport(model: FormulaModel, outcome: Extract<LpOutcome, { status: 'optimal' }>): RangingReport[] {
  const B = model.problem.batchKg;
  return model.problem.ingredients.map((ing, j): RangingReport => {
    const lim = model.limits[j];
    if (lim.fixed) return { id: ing.id, inMix: true, fixed: true, pricePerKg: ing.pricePerKg, lowPrice: null, highPrice: null };
    const kg = outcome.colValue[j] * B;
    const low = outcome.costLow?.[j];
    const high = outcome.costHigh?.[j];
    if (kg > 1e-9 * Math.max(1, B)) {
      return { id: ing.id, inMix: true, pricePerKg: ing.pricePerKg, lowPrice: finiteOrNull(low), highPrice: finiteOrNull(high) };
    }
    // Out of the mix: it enters when its price falls below the bottom of its range.
    const excluded = lim.upperKg <= 0;
    return { id: ing.id, inMix: false, pricePerKg: ing.pricePerKg, entersAtPrice: excluded ? null : finiteOrNull(low) };
  });
}

function collectWarnings(model: FormulaModel): string[] {
  const out: string[] = [];
  const p = model.problem;
  const present = new Set<string>();
  for (const ing of p.ingredients) for (const [k, v] of Object.entries(ing.nutrients)) if (v !== 0) present.add(k);
  for (const nb of p.nutrients) {
    if (!present.has(nb.id) && (nb.min ?? 0) > 0) out.push(`No ingredient supplies ${nb.name ?? nb.id}.`);
  }
  let minSum = 0;
  for (const l of model.limits) minSum += l.lowerKg;
  if (minSum > p.batchKg * (1 + 1e-9)) out.push(`Ingredient minimums add up to ${minSum} kg, more than the ${p.batchKg} kg batch.`);
  return out;
}
