/**
 * {@link LpSolver} on javascript-lp-solver, reading duals, reduced costs and cost
 * ranging straight from its final simplex tableau (one solve gives the whole
 * sensitivity report; no re-solves).
 *
 * Tableau layout (javascript-lp-solver 1.0.x, dense dictionary form): row 0 is the
 * objective, column 0 the right-hand side; for a minimisation the basic variable of
 * row r is `M[r][0] - Σ_c M[r][c]·x_c` over the nonbasic columns c and the objective is
 * `M[0][0] - Σ_c M[0][c]·x_c`, so `-M[0][c]` is the reduced cost of nonbasic column c.
 * A `<=` row i has slack `rhs_i - a_i x`, a `>=` row `a_i x - rhs_i`; so the dual
 * d(objective)/d(rhs_i) is `M[0][c]` for a nonbasic `<=` slack and `-M[0][c]` for `>=`.
 *
 * Guarding its tolerances: the library's `precision` (1e-8) is both its pivot tolerance
 * and its rounding grid, so it is left alone; instead every row is scaled by a power of
 * two to bring its largest coefficient near 1 and the objective likewise, which keeps
 * 1e-8 meaningful for kcal rows and percent rows alike. Values are read unrounded from
 * the tableau; callers must still verify the point against the LP (see
 * `maxScaledViolation`).
 */
import lpSolverLib from 'javascript-lp-solver';
import type { LinearProgram, LpOutcome, LpSolveOptions, LpSolver } from './lp-types';

const PRECISION = 1e-8;
/** A basic value below this (scaled units) counts as sitting at its bound. */
const DEGENERATE_TOL = 1e-9;
const ZERO_COEF = 1e-11;

type JsModel = InstanceType<typeof lpSolverLib.Model>;
type JsConstraint = ReturnType<JsModel['smallerThan']>;
type JsVariable = ReturnType<JsModel['addVariable']>;

interface Part {
  con: JsConstraint;
  /** LP row index, or -1 when the part is a column upper bound. */
  row: number;
  /** LP column index for a column upper bound, else -1. */
  col: number;
  isUpper: boolean;
  /** Row scale applied (scaled row = scale × original row). */
  scale: number;
  /** Part of an equality pair: its slack is pinned at zero and never enters a ratio test. */
  twin: boolean;
}

function pow2Scale(maxAbs: number): number {
  return maxAbs > 0 && Number.isFinite(maxAbs) ? Math.pow(2, -Math.round(Math.log2(maxAbs))) : 1;
}

/** Solve with javascript-lp-solver; never throws. */
export function solveWithSimplexJs(lp: LinearProgram, options: LpSolveOptions = {}): LpOutcome {
  try {
    return solveInner(lp, options);
  } catch (err) {
    return { status: 'error', message: `javascript-lp-solver failed: ${(err as Error).message}` };
  }
}

function solveInner(lp: LinearProgram, options: LpSolveOptions): LpOutcome {
  const built = createSimplexJsModel(lp);
  return 'status' in built ? built : built.solve(options);
}

/**
 * A javascript-lp-solver model kept alive for warm re-solves: after `setCost`, `solve`
 * continues from the last optimal tableau (still primal feasible, so only phase 2 runs).
 */
export interface SimplexJsModel {
  /** Change the objective coefficient of column j (currency per unit of the column). */
  setCost(j: number, cost: number): void;
  /** Solve (first call) or re-solve warm (later calls); never throws. */
  solve(options?: LpSolveOptions): LpOutcome;
}

/** Build a warm-startable javascript-lp-solver model, or an outcome when the LP is trivially infeasible/invalid. */
export function createSimplexJsModel(lp: LinearProgram): SimplexJsModel | Extract<LpOutcome, { status: 'infeasible' | 'error' }> {
  const nCols = lp.colCost.length;
  const nRows = lp.rows.length;
  let costMax = 0;
  for (let j = 0; j < nCols; j++) {
    if (!Number.isFinite(lp.colLower[j])) {
      return { status: 'error', message: `column ${lp.colNames[j]} needs a finite lower bound` };
    }
    if (lp.colUpper[j] < lp.colLower[j]) return { status: 'infeasible' };
    costMax = Math.max(costMax, Math.abs(lp.colCost[j]));
  }
  const k = pow2Scale(costMax);

  const model = new lpSolverLib.Model(PRECISION);
  // Presolve zeroes the cost of variables it fixes, which would corrupt the duals read below.
  model.usePresolve = false;
  const vars: JsVariable[] = new Array(nCols);
  for (let j = 0; j < nCols; j++) vars[j] = model.addVariable(lp.colCost[j] * k, 'x' + j);

  const parts: Part[] = [];
  for (let i = 0; i < nRows; i++) {
    const row = lp.rows[i];
    let amax = 0;
    let shift = 0;
    for (let t = 0; t < row.index.length; t++) {
      amax = Math.max(amax, Math.abs(row.value[t]));
      shift += row.value[t] * lp.colLower[row.index[t]];
    }
    const s = pow2Scale(amax);
    const lo = lp.rowLower[i] - shift;
    const up = lp.rowUpper[i] - shift;
    const addTerms = (c: { addTerm(coefficient: number, variable: unknown): unknown }) => {
      for (let t = 0; t < row.index.length; t++) {
        const a = row.value[t];
        if (a !== 0) c.addTerm(a * s, vars[row.index[t]]);
      }
    };
    if (Number.isFinite(lo) && lo === up) {
      const eq = model.equal(lo * s);
      addTerms(eq);
      parts.push({ con: eq.upperBound, row: i, col: -1, isUpper: true, scale: s, twin: true });
      parts.push({ con: eq.lowerBound, row: i, col: -1, isUpper: false, scale: s, twin: true });
      continue;
    }
    if (lo > up) return { status: 'infeasible' };
    if (Number.isFinite(lo)) {
      const c = model.greaterThan(lo * s);
      addTerms(c);
      parts.push({ con: c, row: i, col: -1, isUpper: false, scale: s, twin: false });
    }
    if (Number.isFinite(up)) {
      const c = model.smallerThan(up * s);
      addTerms(c);
      parts.push({ con: c, row: i, col: -1, isUpper: true, scale: s, twin: false });
    }
  }
  for (let j = 0; j < nCols; j++) {
    if (Number.isFinite(lp.colUpper[j])) {
      const c = model.smallerThan(lp.colUpper[j] - lp.colLower[j]);
      c.addTerm(1, vars[j]);
      parts.push({ con: c, row: -1, col: j, isUpper: true, scale: 1, twin: false });
    }
  }

  const costs = [...lp.colCost];
  let solved = false;
  return {
    setCost(j: number, cost: number) {
      costs[j] = cost;
      if (solved) model.setCost(cost * k, vars[j]);
      else vars[j].cost = cost * k;
    },
    solve(options: LpSolveOptions = {}): LpOutcome {
      try {
        model.solve();
        solved = true;
        return readTableau(model, vars, parts, { ...lp, colCost: costs }, k, options);
      } catch (err) {
        return { status: 'error', message: `javascript-lp-solver failed: ${(err as Error).message}` };
      }
    },
  };
}

function readTableau(model: JsModel, vars: JsVariable[], parts: Part[], lp: LinearProgram, k: number, options: LpSolveOptions): LpOutcome {
  const nCols = lp.colCost.length;
  const nRows = lp.rows.length;
  const t = model.tableau;
  if (!t.feasible) return { status: 'infeasible' };
  if (!t.bounded) return { status: 'unbounded' };

  const M = t.matrix;
  const W = t.width;
  const H = t.height;
  const twinSlack = new Set<number>();
  for (const p of parts) if (p.twin) twinSlack.add(p.con.index);

  const colValue = new Float64Array(nCols);
  for (let j = 0; j < nCols; j++) {
    const r = t.rowByVarIndex[vars[j].index];
    let v = r === -1 ? 0 : M[r * W];
    // The library accepts basics down to -precision as feasible: snap that noise to the bound.
    if (v < 0 && v > -10 * PRECISION) v = 0;
    colValue[j] = lp.colLower[j] + v;
  }
  let objective = 0;
  for (let j = 0; j < nCols; j++) objective += lp.colCost[j] * colValue[j];

  const rowDual = new Float64Array(nRows);
  const colDual = new Float64Array(nCols);
  for (const p of parts) {
    const c = t.colByVarIndex[p.con.index];
    if (c === -1 || c === undefined) continue;
    const m0 = M[c];
    const d = ((p.isUpper ? m0 : -m0) / k) * p.scale;
    if (p.row >= 0) rowDual[p.row] += d;
    else colDual[p.col] += d;
  }
  for (let j = 0; j < nCols; j++) {
    const c = t.colByVarIndex[vars[j].index];
    if (c !== -1 && c !== undefined) colDual[j] += -M[c] / k;
  }

  let degenerate = false;
  for (let r = 1; r < H; r++) {
    if (twinSlack.has(t.varIndexByRow[r])) continue;
    if (M[r * W] < DEGENERATE_TOL) {
      degenerate = true;
      break;
    }
  }
  let alternativeOptima = false;
  for (let c = 1; c < W; c++) {
    if (twinSlack.has(t.varIndexByCol[c])) continue;
    if (Math.abs(M[c]) < DEGENERATE_TOL) {
      alternativeOptima = true;
      break;
    }
  }

  const out: LpOutcome = {
    status: 'optimal',
    objective,
    colValue,
    rowDual,
    colDual,
    degenerate,
    alternativeOptima,
  };
  if (options.costRanging) {
    const costLow = new Float64Array(nCols);
    const costHigh = new Float64Array(nCols);
    const skipCol = new Uint8Array(W);
    for (let c = 1; c < W; c++) if (twinSlack.has(t.varIndexByCol[c])) skipCol[c] = 1;
    for (let j = 0; j < nCols; j++) {
      const cj = lp.colCost[j];
      const cIdx = t.colByVarIndex[vars[j].index];
      if (cIdx !== -1 && cIdx !== undefined) {
        costLow[j] = cj - Math.max(0, -M[cIdx]) / k;
        costHigh[j] = Infinity;
        continue;
      }
      const r = t.rowByVarIndex[vars[j].index];
      let down = -Infinity;
      let up = Infinity;
      const off = r * W;
      for (let c = 1; c < W; c++) {
        if (skipCol[c]) continue;
        const a = M[off + c];
        if (a > -ZERO_COEF && a < ZERO_COEF) continue;
        const m0 = Math.min(M[c], 0);
        const ratio = -m0 / a;
        if (a > 0) {
          if (ratio < up) up = ratio;
        } else if (ratio > down) down = ratio;
      }
      costLow[j] = cj + down / k;
      costHigh[j] = cj + up / k;
    }
    out.costLow = costLow;
    out.costHigh = costHigh;
  }
  return out;
}

/** The in-app solver: javascript-lp-solver with duals and ranging read from its tableau. */
export const simplexJs: LpSolver = {
  name: 'javascript-lp-solver',
  solve: solveWithSimplexJs,
};
