/**
 * Allocation by price-directive decomposition over the shared-stock rows
 * (Dantzig–Wolfe), so large allocations stay on javascript-lp-solver.
 *
 * The master LP chooses, for each formula, a convex combination of mixes proposed so
 * far, subject to the stock rows. Its stock duals π (<= 0, the value of a kg of stock)
 * re-price the stocked ingredients; each formula is then re-solved alone at those
 * prices (a small LP, warm-started from its previous tableau because only costs
 * change) and proposes its new mix when that lowers the master's cost. At convergence
 * the combined mixes are an optimum of the whole allocation, and the stock duals plus
 * each formula's own duals are optimal duals of the whole LP.
 *
 * Phase 1 (only when the price-optimal mixes overdraw a stock) minimises the relative
 * stock overdraft; a positive minimum proves the stocks cannot cover every formula.
 */
import type { AllocationModel } from './allocate';
import type { LinearProgram, LpOutcome, LpSolver } from './lp-types';
import { createSimplexJsModel, type SimplexJsModel } from './simplex-js';

const MAX_ROUNDS = 200;

interface Proposal {
  x: Float64Array;
  /** Cost of the whole formula batch with this mix. */
  cost: number;
  /** kg of each stock row used. */
  use: Float64Array;
}

/**
 * Solve the allocation LP of `am` by decomposition. Returns an {@link LpOutcome} for the
 * monolithic LP `am.lp` (values, row duals, reduced costs), so it is checked and reported
 * exactly like a direct solve. `master` solves the master LPs (default: javascript-lp-solver).
 */
export function solveByDecomposition(am: AllocationModel, master: LpSolver): LpOutcome {
  const F = am.models.length;
  const S = am.stocks.length;
  // Per formula: for each of its columns, which stock row (index into am.stocks) it draws on.
  const stockOfCol: Int32Array[] = am.models.map((m) => new Int32Array(m.lp.colCost.length).fill(-1));
  am.stocks.forEach((s, k) => {
    const row = am.lp.rows[s.row];
    for (const c of row.index) {
      const f = formulaOfColumn(am, c);
      stockOfCol[f][c - am.colStart[f]] = k;
    }
  });

  const subs: SimplexJsModel[] = [];
  const baseCost: number[][] = [];
  const proposals: Proposal[][] = [];
  for (let f = 0; f < F; f++) {
    const m = am.models[f];
    const B = m.problem.batchKg;
    const costs = m.lp.colCost.map((c) => c * B);
    baseCost.push(costs);
    const built = createSimplexJsModel({ ...m.lp, colCost: costs });
    if ('status' in built) return built.status === 'infeasible' ? { status: 'infeasible' } : built;
    subs.push(built);
    const o = built.solve();
    if (o.status !== 'optimal') return o.status === 'infeasible' ? { status: 'infeasible' } : { status: 'error', message: `formula ${f}: ${o.status}` };
    proposals.push([makeProposal(am, f, o.colValue, costs, stockOfCol[f], S)]);
  }

  const lastSub: Extract<LpOutcome, { status: 'optimal' }>[] = new Array(F);
  const overdrawn = am.stocks.some((s, k) => proposals.reduce((t, p) => t + p[0].use[k], 0) > s.kg * (1 + 1e-9) + 1e-9);
  if (overdrawn) {
    const p1 = columnGeneration(am, master, subs, baseCost, proposals, stockOfCol, lastSub, 1);
    if (p1.status !== 'optimal') return p1;
    if (p1.objective > 1e-9) return { status: 'infeasible' };
  }
  return columnGeneration(am, master, subs, baseCost, proposals, stockOfCol, lastSub, 2);
}

function formulaOfColumn(am: AllocationModel, c: number): number {
  let lo = 0;
  let hi = am.colStart.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (am.colStart[mid] <= c) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

function makeProposal(am: AllocationModel, f: number, x: Float64Array, costs: number[], stockOf: Int32Array, S: number): Proposal {
  const B = am.models[f].problem.batchKg;
  let cost = 0;
  const use = new Float64Array(S);
  for (let j = 0; j < x.length; j++) {
    cost += costs[j] * x[j];
    if (stockOf[j] >= 0) use[stockOf[j]] += B * x[j];
  }
  return { x: Float64Array.from(x), cost, use };
}

function columnGeneration(
  am: AllocationModel,
  master: LpSolver,
  subs: SimplexJsModel[],
  baseCost: number[][],
  proposals: Proposal[][],
  stockOfCol: Int32Array[],
  lastSub: Extract<LpOutcome, { status: 'optimal' }>[],
  phase: 1 | 2,
): LpOutcome {
  const F = am.models.length;
  const S = am.stocks.length;
  for (let round = 0; round < MAX_ROUNDS; round++) {
    const { lp, owner } = buildMaster(am, proposals, phase);
    const mo = master.solve(lp);
    // The phase-1 master always has a solution (overdrafts absorb any shortage); a phase-2 master
    // can only fail through numerical trouble, which is reported, never guessed around.
    if (mo.status !== 'optimal') return { status: 'error', message: `decomposition master (phase ${phase}): ${mo.status}` };
    const pi = mo.rowDual.subarray(0, S);
    const sigma = mo.rowDual.subarray(S, S + F);
    let added = 0;
    for (let f = 0; f < F; f++) {
      const B = am.models[f].problem.batchKg;
      const costs = baseCost[f].map((c, j) => (phase === 2 ? c : 0) - (stockOfCol[f][j] >= 0 ? pi[stockOfCol[f][j]] * B : 0));
      for (let j = 0; j < costs.length; j++) subs[f].setCost(j, costs[j]);
      const o = subs[f].solve();
      if (o.status !== 'optimal') return { status: 'error', message: `decomposition: formula ${f} sub-problem ${o.status}` };
      lastSub[f] = o;
      const scale = Math.max(1, Math.abs(sigma[f]), Math.abs(o.objective));
      if (o.objective - sigma[f] < -1e-9 * scale) {
        proposals[f].push(makeProposal(am, f, o.colValue, baseCost[f], stockOfCol[f], S));
        added++;
      }
    }
    if (added === 0) {
      if (phase === 1) return mo;
      return combine(am, proposals, owner, mo, lastSub);
    }
  }
  return { status: 'error', message: `decomposition did not converge in ${MAX_ROUNDS} rounds` };
}

function buildMaster(am: AllocationModel, proposals: Proposal[][], phase: 1 | 2): { lp: LinearProgram; owner: { f: number; k: number }[] } {
  const S = am.stocks.length;
  const F = proposals.length;
  const lp: LinearProgram = { colNames: [], colCost: [], colLower: [], colUpper: [], rowNames: [], rowLower: [], rowUpper: [], rows: [] };
  for (let s = 0; s < S; s++) {
    lp.rowNames.push(`stock[${am.stocks[s].id}]`);
    lp.rowLower.push(-Infinity);
    lp.rowUpper.push(am.stocks[s].kg);
    lp.rows.push({ index: [], value: [] });
  }
  for (let f = 0; f < F; f++) {
    lp.rowNames.push(`convexity[${f}]`);
    lp.rowLower.push(1);
    lp.rowUpper.push(1);
    lp.rows.push({ index: [], value: [] });
  }
  const owner: { f: number; k: number }[] = [];
  proposals.forEach((list, f) => {
    list.forEach((p, k) => {
      const c = lp.colCost.length;
      lp.colNames.push(`mix[${f},${k}]`);
      lp.colCost.push(phase === 2 ? p.cost : 0);
      lp.colLower.push(0);
      lp.colUpper.push(Infinity);
      owner.push({ f, k });
      for (let s = 0; s < S; s++) {
        if (p.use[s] !== 0) {
          lp.rows[s].index.push(c);
          lp.rows[s].value.push(p.use[s]);
        }
      }
      lp.rows[S + f].index.push(c);
      lp.rows[S + f].value.push(1);
    });
  });
  if (phase === 1) {
    for (let s = 0; s < S; s++) {
      const c = lp.colCost.length;
      lp.colNames.push(`overdraft[${am.stocks[s].id}]`);
      lp.colCost.push(1 / Math.max(am.stocks[s].kg, 1));
      lp.colLower.push(0);
      lp.colUpper.push(Infinity);
      lp.rows[s].index.push(c);
      lp.rows[s].value.push(-1);
    }
  }
  return { lp, owner };
}

function combine(
  am: AllocationModel,
  proposals: Proposal[][],
  owner: { f: number; k: number }[],
  mo: Extract<LpOutcome, { status: 'optimal' }>,
  lastSub: Extract<LpOutcome, { status: 'optimal' }>[],
): LpOutcome {
  const nCols = am.lp.colCost.length;
  const nRows = am.lp.rows.length;
  const colValue = new Float64Array(nCols);
  owner.forEach(({ f, k }, c) => {
    const lambda = mo.colValue[c];
    if (lambda === 0) return;
    const x = proposals[f][k].x;
    const c0 = am.colStart[f];
    for (let j = 0; j < x.length; j++) colValue[c0 + j] += lambda * x[j];
  });
  const rowDual = new Float64Array(nRows);
  const colDual = new Float64Array(nCols);
  am.models.forEach((m, f) => {
    const sub = lastSub[f];
    rowDual.set(sub.rowDual, am.rowStart[f]);
    colDual.set(sub.colDual, am.colStart[f]);
  });
  am.stocks.forEach((s, k) => {
    rowDual[s.row] = mo.rowDual[k];
  });
  let objective = 0;
  for (let j = 0; j < nCols; j++) objective += am.lp.colCost[j] * colValue[j];
  return { status: 'optimal', objective, colValue, rowDual, colDual, degenerate: true, alternativeOptima: true };
}
