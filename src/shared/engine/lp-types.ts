/**
 * The engine's own small linear-programming interface.
 *
 * Every formulation model (single formula, elastic diagnosis, allocation) is
 * written once as a {@link LinearProgram} in natural units; a {@link LpSolver}
 * turns it into numbers. The in-app solver is javascript-lp-solver
 * (`simplex-js.ts`); the server can inject a HiGHS solver for large
 * allocations. Neither the models nor the reports depend on which one ran.
 */

/**
 * A minimisation LP: min colCost·x subject to rowLower <= A x <= rowUpper and
 * colLower <= x <= colUpper. Infinite bounds are `Infinity` / `-Infinity`.
 * Column lower bounds must be finite (every engine variable is an amount).
 * A row with rowLower === rowUpper is an equality.
 */
export interface LinearProgram {
  /** Column (variable) names, for messages and debugging. */
  colNames: string[];
  /** Objective coefficient of each column (currency per unit of the column). */
  colCost: number[];
  colLower: number[];
  colUpper: number[];
  /** Row names, for messages and debugging. */
  rowNames: string[];
  rowLower: number[];
  rowUpper: number[];
  /** Sparse rows: column indices and coefficients of each row (no duplicate index in a row). */
  rows: SparseRow[];
}

/** One sparse row of the constraint matrix. */
export interface SparseRow {
  index: number[];
  value: number[];
}

/**
 * Result of one LP solve, in the units of the {@link LinearProgram}.
 *
 * - `optimal`: `colValue` is an optimal point; `rowDual[i]` is d(objective)/d(active bound of row i)
 *   (0 when the row is not at a bound); `colDual[j]` is the reduced cost: d(objective)/d(active
 *   bound of column j) (>= 0 at a lower bound, <= 0 at an upper bound, 0 when strictly between).
 *   `costLow`/`costHigh` (when `costRanging` was asked) give, per column, the objective-coefficient
 *   interval over which the same basis stays optimal (infinite ends are ±Infinity).
 *   `degenerate` is true when a basic variable sits at a bound, in which case duals need not be unique.
 * - `infeasible`: no point satisfies all bounds.
 * - `unbounded`: the objective decreases without limit.
 * - `error`: the solver failed (numerical trouble, iteration limit); `message` says why.
 */
export type LpOutcome =
  | {
      status: 'optimal';
      objective: number;
      colValue: Float64Array;
      rowDual: Float64Array;
      colDual: Float64Array;
      costLow?: Float64Array;
      costHigh?: Float64Array;
      degenerate: boolean;
      /** Nonbasic columns/rows with zero reduced cost exist: another optimal mix may exist. */
      alternativeOptima: boolean;
      iterations?: number;
    }
  | { status: 'infeasible' }
  | { status: 'unbounded' }
  | { status: 'error'; message: string };

/** Options for one LP solve. */
export interface LpSolveOptions {
  /** Compute objective-coefficient ranging for every column (default false). */
  costRanging?: boolean;
}

/** A synchronous LP solver. Implementations must never throw on a well-formed LP. */
export interface LpSolver {
  /** Name reported in results (e.g. "javascript-lp-solver", "highs"). */
  readonly name: string;
  solve(lp: LinearProgram, options?: LpSolveOptions): LpOutcome;
}

/** Row activity A x of an LP at a point (computed, never taken from a solver). */
export function rowActivity(lp: LinearProgram, x: ArrayLike<number>): Float64Array {
  const out = new Float64Array(lp.rows.length);
  for (let i = 0; i < lp.rows.length; i++) {
    const row = lp.rows[i];
    let s = 0;
    for (let k = 0; k < row.index.length; k++) s += row.value[k] * x[row.index[k]];
    out[i] = s;
  }
  return out;
}

/**
 * Largest violation of any row or column bound at x, each measured relative to the
 * largest absolute coefficient of its row (1 for columns), so that a kcal row and a
 * percent row are judged on the same footing. Returns the violation and where it is.
 */
export function maxScaledViolation(
  lp: LinearProgram,
  x: ArrayLike<number>,
): { violation: number; where: string | null } {
  let worst = 0;
  let where: string | null = null;
  for (let j = 0; j < lp.colCost.length; j++) {
    const v = Math.max(lp.colLower[j] - x[j], x[j] - lp.colUpper[j], 0);
    if (v > worst) {
      worst = v;
      where = lp.colNames[j];
    }
  }
  const act = rowActivity(lp, x);
  for (let i = 0; i < lp.rows.length; i++) {
    let scale = 0;
    for (const a of lp.rows[i].value) scale = Math.max(scale, Math.abs(a));
    if (scale === 0) scale = 1;
    const v = Math.max(lp.rowLower[i] - act[i], act[i] - lp.rowUpper[i], 0) / scale;
    if (v > worst) {
      worst = v;
      where = lp.rowNames[i];
    }
  }
  return { violation: worst, where };
}
