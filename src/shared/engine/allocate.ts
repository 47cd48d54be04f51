/**
 * Allocation: several formulas, each with its tonnage, made from shared limited stocks,
 * solved as one LP that minimises the total cost.
 *
 * The LP is block-diagonal (one block per formula, the formula's own model in shares
 * of its batch, costed per batch) plus one row per stocked ingredient:
 * Σ_f batchKg_f · x_fj <= stockKg_j. The stock rows' duals are the value of one more kg.
 *
 * javascript-lp-solver's dense tableau grows with (formulas × ingredients) × (formulas ×
 * bounds), so by default the LP is solved by decomposition over the stock rows
 * (`decompose.ts`), which keeps every LP small; HiGHS (server) is the fallback. See README.md.
 */
import {
  allocationProblemSchema,
  resolveAllocationFormula,
  type AllocatedFormula,
  type AllocationProblem,
  type AllocationResult,
  type Relaxation,
  type StockReport,
} from '../schemas/formulation';
import { solveByDecomposition } from './decompose';
import { diagnoseFormula } from './diagnose';
import { fieldErrors, fmt } from './format';
import { buildFormulaModel, type FormulaModel } from './formula-model';
import { DEFAULT_TOLERANCE } from './formulate';
import { maxScaledViolation, type LinearProgram, type LpOutcome, type LpSolver } from './lp-types';
import { reportMix, solvedFormulaFields } from './report';
import { simplexJs } from './simplex-js';

/**
 * Above this many formulas the monolithic javascript-lp-solver model is not even tried as a
 * fallback (measured here: 46 ms at 20 formulas of 25 ingredients, 0.35 s at 40, seconds at 100).
 */
export const DIRECT_FORMULA_LIMIT = 24;

/** Allocation options. */
export interface AllocationOptions {
  /** Solver for the monolithic model when it is small (default javascript-lp-solver). */
  solver?: LpSolver;
  /** Sparse solver for large monolithic models (the server passes HiGHS). */
  largeSolver?: LpSolver;
  /**
   * 'auto' (default): decomposition over the stock rows on `solver`; if it fails, `largeSolver`
   * when given, then the monolithic model up to {@link DIRECT_FORMULA_LIMIT} formulas.
   * 'direct' forces the monolithic model on `solver`; 'large' forces `largeSolver`;
   * 'decomposition' forces the decomposition.
   */
  method?: 'auto' | 'direct' | 'large' | 'decomposition';
  trusted?: boolean;
}

/** The allocation LP with its bookkeeping. */
export interface AllocationModel {
  problem: AllocationProblem;
  models: FormulaModel[];
  lp: LinearProgram;
  /** First LP column and first LP row of each formula block. */
  colStart: number[];
  rowStart: number[];
  /** Stock rows: library ingredient id, available kg, LP row. */
  stocks: { id: string; kg: number; row: number }[];
}

/** Build the monolithic allocation LP. */
export function buildAllocationModel(problem: AllocationProblem): AllocationModel {
  const models = problem.formulas.map((_, f) => buildFormulaModel(resolveAllocationFormula(problem, f)));
  const lp: LinearProgram = { colNames: [], colCost: [], colLower: [], colUpper: [], rowNames: [], rowLower: [], rowUpper: [], rows: [] };
  const colStart: number[] = [];
  const rowStart: number[] = [];
  models.forEach((m, f) => {
    const B = m.problem.batchKg;
    const c0 = lp.colCost.length;
    colStart.push(c0);
    rowStart.push(lp.rows.length);
    const fid = problem.formulas[f].id;
    m.lp.colCost.forEach((c, j) => {
      lp.colNames.push(`${fid}/${m.lp.colNames[j]}`);
      lp.colCost.push(c * B);
      lp.colLower.push(m.lp.colLower[j]);
      lp.colUpper.push(m.lp.colUpper[j]);
    });
    m.lp.rows.forEach((r, i) => {
      lp.rowNames.push(`${fid}/${m.lp.rowNames[i]}`);
      lp.rows.push({ index: r.index.map((j) => j + c0), value: [...r.value] });
      lp.rowLower.push(m.lp.rowLower[i]);
      lp.rowUpper.push(m.lp.rowUpper[i]);
    });
  });
  const stocks: AllocationModel['stocks'] = [];
  for (const ing of problem.ingredients) {
    if (ing.stockKg === undefined) continue;
    const index: number[] = [];
    const value: number[] = [];
    models.forEach((m, f) => {
      const j = m.problem.ingredients.findIndex((i) => i.id === ing.id);
      if (j >= 0) {
        index.push(colStart[f] + j);
        value.push(m.problem.batchKg);
      }
    });
    if (index.length === 0) continue;
    stocks.push({ id: ing.id, kg: ing.stockKg, row: lp.rows.length });
    lp.rowNames.push(`stock[${ing.id}]`);
    lp.rows.push({ index, value });
    lp.rowLower.push(-Infinity);
    lp.rowUpper.push(ing.stockKg);
  }
  return { problem, models, lp, colStart, rowStart, stocks };
}

/**
 * Solve an allocation.
 * @returns `optimal` with each formula's mix, levels and shadow prices, the stock use and the
 *   value per tonne of each binding stock; `infeasible` naming the formula that cannot be made
 *   or the stocks that are short (with how much more is needed); `invalid` with field errors;
 *   `failed` when no solver produced an answer that passes the bound check.
 */
export function allocate(input: unknown, options: AllocationOptions = {}): AllocationResult {
  let problem: AllocationProblem;
  if (options.trusted) problem = input as AllocationProblem;
  else {
    const parsed = allocationProblemSchema.safeParse(input);
    if (!parsed.success) {
      const errors = fieldErrors(parsed.error.issues);
      return { status: 'invalid', message: `${errors[0].field}: ${errors[0].message}`, errors };
    }
    problem = parsed.data;
  }
  const tolerance = problem.options?.tolerance ?? DEFAULT_TOLERANCE;
  const am = buildAllocationModel(problem);
  const small = options.solver ?? simplexJs;
  const methods = planMethods(am, options);
  let failure = 'no solver ran';
  for (const method of methods) {
    let outcome: LpOutcome;
    let solverName: string;
    if (method === 'decomposition') {
      outcome = solveByDecomposition(am, small);
      solverName = `decomposition/${small.name}`;
    } else {
      const s = method === 'large' && options.largeSolver ? options.largeSolver : small;
      outcome = s.solve(am.lp);
      solverName = s.name;
    }
    if (outcome.status === 'infeasible') return explainAllocation(am, options.largeSolver ?? small);
    if (outcome.status === 'unbounded') return { status: 'unbounded', message: 'The total cost can fall without limit; check for negative prices.' };
    if (outcome.status === 'error') {
      failure = outcome.message;
      continue;
    }
    const check = maxScaledViolation(am.lp, outcome.colValue);
    if (check.violation > tolerance) {
      failure = `the allocation from ${solverName} breaks ${check.where ?? 'a bound'} by ${check.violation.toExponential(2)} (relative)`;
      continue;
    }
    return reportAllocation(am, outcome, solverName, check.violation, tolerance);
  }
  return { status: 'failed', message: `No allocation passed the bound check: ${failure}. No answer is reported.` };
}

/**
 * Methods to try, in order. 'auto': the decomposition (fastest on javascript-lp-solver at
 * every size measured), then the sparse solver if given, then the monolithic model while it
 * is small enough; a method that fails or whose answer fails the bound check hands over to the next.
 */
function planMethods(am: AllocationModel, options: AllocationOptions): ('direct' | 'large' | 'decomposition')[] {
  const m = options.method ?? 'auto';
  if (m === 'direct' || m === 'decomposition') return [m];
  if (m === 'large') return [options.largeSolver ? 'large' : 'decomposition'];
  return ['decomposition', ...(options.largeSolver ? (['large'] as const) : []), ...(am.models.length <= DIRECT_FORMULA_LIMIT ? (['direct'] as const) : [])];
}

function reportAllocation(
  am: AllocationModel,
  outcome: Extract<LpOutcome, { status: 'optimal' }>,
  solver: string,
  violation: number,
  tolerance: number,
): AllocationResult {
  const formulas: AllocatedFormula[] = am.models.map((m, f) => {
    const B = m.problem.batchKg;
    const n = m.lp.colCost.length;
    const c0 = am.colStart[f];
    const r0 = am.rowStart[f];
    const x = outcome.colValue.subarray(c0, c0 + n);
    const rowDual = Float64Array.from(outcome.rowDual.subarray(r0, r0 + m.lp.rows.length), (d) => d / B);
    const colDual = Float64Array.from(outcome.colDual.subarray(c0, c0 + n), (d) => d / B);
    const rep = reportMix(m, x, { rowDual, colDual }, tolerance);
    const spec = am.problem.formulas[f];
    return {
      id: spec.id,
      ...(spec.name ? { name: spec.name } : {}),
      ...solvedFormulaFields(rep, B),
    };
  });
  const stocks: StockReport[] = am.stocks.map((s) => {
    const row = am.lp.rows[s.row];
    let used = 0;
    for (let k = 0; k < row.index.length; k++) used += row.value[k] * outcome.colValue[row.index[k]];
    const dual = outcome.rowDual[s.row];
    return {
      id: s.id,
      availableKg: s.kg,
      usedKg: used,
      binding: used >= s.kg - Math.max(1e-9, tolerance * s.kg),
      valuePerTonne: Math.max(0, -dual * 1000),
    };
  });
  const totalCost = formulas.reduce((s, f) => s + f.costPerBatch, 0);
  return { status: 'optimal', totalCost, formulas, stocks, check: { solver, maxViolation: violation, tolerance } };
}

/** Explain an infeasible allocation: a formula that cannot be made alone, or short stocks. */
function explainAllocation(am: AllocationModel, solver: LpSolver): AllocationResult {
  const stockMap = new Map(am.stocks.map((s) => [s.id, s.kg]));
  for (let f = 0; f < am.models.length; f++) {
    const alone = buildFormulaModel(am.models[f].problem, stockMap);
    const o = solver.solve(alone.lp);
    if (o.status === 'optimal') continue;
    const d = diagnoseFormula(alone, solver);
    const id = am.problem.formulas[f].id;
    const relaxations = d.kind === 'infeasible' ? d.result.relaxations : [];
    return {
      status: 'infeasible',
      formula: id,
      message: `Formula ${id} cannot be made even on its own${relaxations.length ? ': ' + relaxations.map((r) => r.message).join('; ') : ''}.`,
      relaxations,
    };
  }
  // Each formula can be made alone: the stocks cannot cover all of them together.
  const lp = am.lp;
  const n = lp.colCost.length;
  const elastic: LinearProgram = {
    ...lp,
    colNames: [...lp.colNames],
    colCost: new Array(n).fill(0),
    colLower: [...lp.colLower],
    colUpper: [...lp.colUpper],
    rows: lp.rows.map((r) => ({ index: [...r.index], value: [...r.value] })),
  };
  am.stocks.forEach((s) => {
    elastic.colNames.push(`extra[${s.id}]`);
    elastic.colCost.push(1 / Math.max(s.kg, 1));
    elastic.colLower.push(0);
    elastic.colUpper.push(Infinity);
    elastic.rows[s.row].index.push(elastic.colCost.length - 1);
    elastic.rows[s.row].value.push(-1);
  });
  const o = solver.solve(elastic);
  const relaxations: Relaxation[] = [];
  if (o.status === 'optimal') {
    am.stocks.forEach((s, k) => {
      const extra = o.colValue[n + k];
      if (extra <= 1e-9 * Math.max(1, s.kg)) return;
      relaxations.push({
        constraint: `ingredients[${s.id}].stockKg`,
        kind: 'stock',
        id: s.id,
        side: 'max',
        bound: s.kg,
        reaches: s.kg + extra,
        by: extra,
        message: `${s.id} stock ${fmt(s.kg)} kg is not enough for all formulas; they need at least ${fmt(s.kg + extra)} kg`,
      });
    });
  }
  return {
    status: 'infeasible',
    message: relaxations.length
      ? `The stocks cannot cover every formula: ${relaxations.map((r) => r.message).join('; ')}.`
      : 'The stocks cannot cover every formula.',
    relaxations,
  };
}
