/**
 * {@link LpSolver} on HiGHS (npm `highs`, WebAssembly). Server-only: the Wasm binary
 * is about 1.2 MB and must never reach the phone bundle, so nothing under src/shared
 * imports this file; the server injects it where the engine accepts a solver.
 *
 * Loading is asynchronous (once per process); solving is synchronous afterwards.
 * The array interface is used throughout: HiGHS's LP-text reader misreads ranged rows.
 */
import highsLoader from 'highs';
import type { Highs } from 'highs';
import type { LinearProgram, LpOutcome, LpSolveOptions, LpSolver } from '../../src/shared/engine/lp-types';

let loading: Promise<Highs> | null = null;

/** Load (once) and return the HiGHS runtime. */
export function loadHighs(): Promise<Highs> {
  if (!loading) loading = highsLoader();
  return loading;
}

function toModelData(h: Highs, lp: LinearProgram) {
  const inf = h.infinity;
  const clip = (v: number) => (v === Infinity ? inf : v === -Infinity ? -inf : v);
  const starts: number[] = [0];
  const indices: number[] = [];
  const values: number[] = [];
  for (const row of lp.rows) {
    for (let t = 0; t < row.index.length; t++) {
      if (row.value[t] === 0) continue;
      indices.push(row.index[t]);
      values.push(row.value[t]);
    }
    starts.push(indices.length);
  }
  return {
    numCols: lp.colCost.length,
    numRows: lp.rows.length,
    colCost: lp.colCost,
    colLower: lp.colLower.map(clip),
    colUpper: lp.colUpper.map(clip),
    rowLower: lp.rowLower.map(clip),
    rowUpper: lp.rowUpper.map(clip),
    matrix: {
      format: 'csr' as const,
      numRows: lp.rows.length,
      numCols: lp.colCost.length,
      starts,
      indices,
      values,
    },
  };
}

/** Wrap a loaded HiGHS runtime as an engine {@link LpSolver}. */
export function highsSolver(h: Highs): LpSolver {
  const ms = h.constants.modelStatus;
  const solve = (lp: LinearProgram, options: LpSolveOptions = {}): LpOutcome => {
    try {
      const data = toModelData(h, lp);
      let modelStatus: number;
      let sol: { colValue: Float64Array; rowDual: Float64Array; colDual: Float64Array; rowValue: Float64Array };
      let basis: { colStatus: Int32Array; rowStatus: Int32Array } | undefined;
      let costLow: Float64Array | undefined;
      let costHigh: Float64Array | undefined;
      if (options.costRanging) {
        const model = h.createModel(data);
        try {
          model.options.set('output_flag', false);
          modelStatus = model.run().modelStatus;
          sol = model.getSolution();
          basis = model.getBasis();
          if (modelStatus === ms.optimal) {
            const rg = model.getRanging();
            costLow = Float64Array.from(rg.colCostDown.value, (v) => (v <= -h.infinity ? -Infinity : v));
            costHigh = Float64Array.from(rg.colCostUp.value, (v) => (v >= h.infinity ? Infinity : v));
          }
        } finally {
          model.dispose();
        }
      } else {
        const r = h.raw.lpCall(data);
        if (r.status === -1) return { status: 'error', message: 'HiGHS rejected the model' };
        modelStatus = r.value.modelStatus;
        sol = r.value.solution;
        basis = r.value.basis;
      }
      if (modelStatus === ms.infeasible) return { status: 'infeasible' };
      if (modelStatus === ms.unbounded || modelStatus === ms.unboundedOrInfeasible) {
        return modelStatus === ms.unbounded ? { status: 'unbounded' } : { status: 'infeasible' };
      }
      if (modelStatus !== ms.optimal) return { status: 'error', message: `HiGHS model status ${modelStatus}` };
      let objective = 0;
      for (let j = 0; j < lp.colCost.length; j++) objective += lp.colCost[j] * sol.colValue[j];
      let degenerate = false;
      let alternativeOptima = false;
      if (basis) {
        const BASIC = h.constants.basisStatus.basic;
        for (let j = 0; j < lp.colCost.length; j++) {
          const v = sol.colValue[j];
          if (basis.colStatus[j] === BASIC) {
            if (Math.abs(v - lp.colLower[j]) < 1e-9 || Math.abs(v - lp.colUpper[j]) < 1e-9) degenerate = true;
          } else if (Math.abs(sol.colDual[j]) < 1e-9 && lp.colLower[j] !== lp.colUpper[j]) alternativeOptima = true;
        }
        for (let i = 0; i < lp.rows.length; i++) {
          const v = sol.rowValue[i];
          if (basis.rowStatus[i] === BASIC) {
            if (Math.abs(v - lp.rowLower[i]) < 1e-9 || Math.abs(v - lp.rowUpper[i]) < 1e-9) degenerate = true;
          } else if (Math.abs(sol.rowDual[i]) < 1e-9 && lp.rowLower[i] !== lp.rowUpper[i]) alternativeOptima = true;
        }
      }
      return {
        status: 'optimal',
        objective,
        colValue: Float64Array.from(sol.colValue),
        rowDual: Float64Array.from(sol.rowDual),
        colDual: Float64Array.from(sol.colDual),
        costLow,
        costHigh,
        degenerate,
        alternativeOptima,
      };
    } catch (err) {
      return { status: 'error', message: `HiGHS failed: ${(err as Error).message}` };
    }
  };
  return { name: 'highs', solve };
}

/** Load HiGHS and return it as an engine solver (cached runtime). */
export async function getHighsSolver(): Promise<LpSolver> {
  return highsSolver(await loadHighs());
}
