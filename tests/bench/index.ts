/**
 * `npm run bench`: medians of the engine's operations and the ratio against HiGHS solving
 * the same LPs in the same process (HiGHS warmed up first). Targets (2-core machine):
 * single solve <= 0.5 ms and no slower than HiGHS; full sensitivity report <= 5 ms;
 * infeasibility diagnosis <= 2 ms; allocation of 20 formulas <= 50 ms, of 100 <= 250 ms.
 */
import { getHighsSolver } from '../../server/lp/highs-solver';
import { buildAllocationModel, allocate } from '../../src/shared/engine/allocate';
import { buildElastic } from '../../src/shared/engine/diagnose';
import { buildFormulaModel } from '../../src/shared/engine/formula-model';
import { solveFormula } from '../../src/shared/engine/formulate';
import type { LinearProgram, LpSolver } from '../../src/shared/engine/lp-types';
import { simplexJs } from '../../src/shared/engine/simplex-js';
import { allocationProblemSchema, formulaProblemSchema } from '../../src/shared/schemas/formulation';
import { allocationProblem, broilerProblem } from '../unit/engine/generate';

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function time(runs: number, fn: () => unknown): number {
  for (let i = 0; i < Math.min(20, runs); i++) fn();
  const t: number[] = [];
  for (let i = 0; i < runs; i++) {
    const a = performance.now();
    fn();
    t.push(performance.now() - a);
  }
  return median(t);
}

interface Row {
  what: string;
  ms: number;
  highsMs: number | null;
  target: string;
  ok: boolean;
}

const rows: Row[] = [];
function record(what: string, ms: number, highsMs: number | null, targetMs: number, mustBeatHighs = false) {
  const ok = ms <= targetMs && (!mustBeatHighs || highsMs === null || ms <= highsMs);
  rows.push({ what, ms, highsMs, target: `<= ${targetMs} ms${mustBeatHighs ? ', <= HiGHS' : ''}`, ok });
}

async function main() {
  const highs: LpSolver = await getHighsSolver();
  const ration = formulaProblemSchema.parse(broilerProblem(1));
  const model = buildFormulaModel(ration);
  const bounds = model.lp.rows.reduce((s, _r, i) => s + (Number.isFinite(model.lp.rowLower[i]) ? 1 : 0) + (Number.isFinite(model.lp.rowUpper[i]) && model.lp.rowLower[i] !== model.lp.rowUpper[i] ? 1 : 0), -1);
  const colBounds = model.limits.filter((l) => l.lowerKg > 0 || l.upperKg < Infinity).length;
  // HiGHS needs a few hundred solves before its timings settle.
  for (let i = 0; i < 400; i++) highs.solve(model.lp);
  process.stdout.write(`ration: ${ration.ingredients.length} ingredients, ${bounds} nutrient/ratio/group bound sides + ${colBounds} inclusion limits\n`);

  const lpOnly = time(1000, () => simplexJs.solve(model.lp));
  const lpHighs = time(1000, () => highs.solve(model.lp));
  record('single solve, LP only', lpOnly, lpHighs, 0.5, true);
  const quiet = { ...ration, options: { sensitivity: false } };
  const engine = time(500, () => solveFormula(quiet, { trusted: true }));
  record('single solve, engine (build, solve, check, report)', engine, lpHighs, 0.5, false);

  const sens = time(300, () => solveFormula(ration, { trusted: true }));
  const sensHighs = time(300, () => highs.solve(model.lp, { costRanging: true }));
  record('full sensitivity report (shadow prices + ranging)', sens, sensHighs, 5);

  const bad = formulaProblemSchema.parse({ ...broilerProblem(1), nutrients: broilerProblem(1).nutrients.map((n) => (n.id === 'fibre' ? { ...n, max: 0.3 } : n)) });
  const badCheck = solveFormula(bad, { trusted: true });
  if (badCheck.status !== 'infeasible') throw new Error('the diagnosis case should be infeasible');
  const diag = time(300, () => solveFormula(bad, { trusted: true }));
  const badModel = buildFormulaModel(bad);
  const elastic: LinearProgram = buildElastic(badModel, false).lp;
  const diagHighs = time(300, () => {
    highs.solve(badModel.lp);
    highs.solve(elastic);
    highs.solve(elastic);
  });
  record('infeasibility diagnosis (solve + 2 elastic phases)', diag, diagHighs, 2);

  for (const [F, target, runs] of [[20, 50, 15], [100, 250, 7]] as const) {
    const p = allocationProblemSchema.parse(allocationProblem(F, 11));
    const am = buildAllocationModel(p);
    const hiMs = time(runs, () => highs.solve(am.lp));
    const dw = time(runs, () => allocate(p, { trusted: true, method: 'decomposition' }));
    record(`allocation ${F} formulas, decomposition on javascript-lp-solver`, dw, hiMs, target);
    const viaHighs = time(runs, () => allocate(p, { trusted: true, method: 'large', largeSolver: highs }));
    record(`allocation ${F} formulas, engine on HiGHS`, viaHighs, hiMs, target);
    if (F <= 20) {
      const direct = time(runs, () => allocate(p, { trusted: true, method: 'direct' }));
      record(`allocation ${F} formulas, monolithic javascript-lp-solver`, direct, hiMs, target);
    }
    const a = allocate(p, { trusted: true, method: 'decomposition' });
    const b = allocate(p, { trusted: true, method: 'large', largeSolver: highs });
    if (a.status !== 'optimal' || b.status !== 'optimal' || Math.abs(a.totalCost - b.totalCost) > 1e-6 * b.totalCost) {
      throw new Error(`allocation ${F}: decomposition and HiGHS disagree`);
    }
  }
  // One run of the monolithic tableau at 40 formulas shows why it is not used at scale.
  {
    const p = allocationProblemSchema.parse(allocationProblem(40, 11));
    const t = performance.now();
    allocate(p, { trusted: true, method: 'direct' });
    process.stdout.write(`(monolithic javascript-lp-solver, 40 formulas, one run: ${(performance.now() - t).toFixed(0)} ms)\n`);
  }

  const w = Math.max(...rows.map((r) => r.what.length));
  process.stdout.write(`\n${'operation'.padEnd(w)}  median ms   HiGHS ms   ratio   target              \n`);
  for (const r of rows) {
    const ratio = r.highsMs ? (r.ms / r.highsMs).toFixed(2) : '-';
    process.stdout.write(
      `${r.what.padEnd(w)}  ${r.ms.toFixed(3).padStart(9)}  ${(r.highsMs?.toFixed(3) ?? '-').padStart(9)}  ${ratio.padStart(6)}   ${r.target.padEnd(18)} ${r.ok ? 'met' : 'MISSED'}\n`,
    );
  }
  process.stdout.write('(HiGHS column: HiGHS alone on the same LP(s): lpCall for solves, a ranging run for the sensitivity row, the monolithic LP for allocations.)\n');
}

main().catch((err: unknown) => {
  process.stderr.write(`${(err as Error).stack ?? String(err)}\n`);
  process.exit(1);
});
