/**
 * Cross-check against a second, independent solver: HiGHS (npm `highs`, WebAssembly).
 * On 240 generated problems (feasible, infeasible, degenerate, with fixed amounts, small;
 * all with ratios and groups except the small ones) the optimal costs must agree to 1e-6
 * relative, statuses must agree, and where the optimum is unique (non-degenerate, no
 * ties, in both solvers) the shadow prices and price ranging must agree with HiGHS's duals and ranging.
 * Every reported mix is also re-checked here against the problem's bounds.
 */
import assert from 'node:assert/strict';
import { before, describe, test } from 'node:test';

import { getHighsSolver } from '../../../server/lp/highs-solver';
import { buildElastic } from '../../../src/shared/engine/diagnose';
import { buildFormulaModel, nutrientOf } from '../../../src/shared/engine/formula-model';
import { rangingReport, solveFormula } from '../../../src/shared/engine/formulate';
import type { LpSolver } from '../../../src/shared/engine/lp-types';
import { reportMix } from '../../../src/shared/engine/report';
import { simplexJs } from '../../../src/shared/engine/simplex-js';
import { formulaProblemSchema, type FormulaProblem, type OptimalResult } from '../../../src/shared/schemas/formulation';
import { suiteProblem } from './generate';

const N = 240;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1, Math.abs(b));
const close = (a: number | null, b: number | null, tol = 1e-6) =>
  (a === null && b === null) || (a !== null && b !== null && Math.abs(a - b) <= tol * Math.max(1, Math.abs(b)));

/** Independent check of a reported mix against the problem (not the engine's own check). */
function assertMeetsBounds(p: FormulaProblem, r: OptimalResult, label: string) {
  const kg = new Map(r.mix.map((m) => [m.id, m.kg]));
  const total = [...kg.values()].reduce((a, b) => a + b, 0);
  assert.ok(Math.abs(total - p.batchKg) <= 1e-6 * p.batchKg, `${label}: total ${total}`);
  const level = (id: string) => p.ingredients.reduce((s, ing) => s + nutrientOf(ing, id) * (kg.get(ing.id) ?? 0), 0) / p.batchKg;
  for (const nb of p.nutrients) {
    const scale = Math.max(...p.ingredients.map((i) => Math.abs(nutrientOf(i, nb.id))), 1e-9);
    const v = level(nb.id);
    if (nb.min !== undefined) assert.ok(v >= nb.min - 1e-6 * scale, `${label}: ${nb.id} ${v} < ${nb.min}`);
    if (nb.max !== undefined) assert.ok(v <= nb.max + 1e-6 * scale, `${label}: ${nb.id} ${v} > ${nb.max}`);
  }
  for (const ra of p.ratios) {
    const v = ((ra.factor ?? 1) * level(ra.numerator)) / level(ra.denominator);
    if (ra.min !== undefined) assert.ok(v >= ra.min * (1 - 1e-5), `${label}: ratio ${v} < ${ra.min}`);
    if (ra.max !== undefined) assert.ok(v <= ra.max * (1 + 1e-5), `${label}: ratio ${v} > ${ra.max}`);
  }
  for (const g of p.groups) {
    const s = g.members.reduce((a, m) => a + (kg.get(m) ?? 0), 0);
    if (g.minKg !== undefined) assert.ok(s >= g.minKg - 1e-6 * p.batchKg, `${label}: group ${g.id}`);
    if (g.maxKg !== undefined) assert.ok(s <= g.maxKg + 1e-6 * p.batchKg, `${label}: group ${g.id}`);
  }
  for (const ing of p.ingredients) {
    const v = kg.get(ing.id) ?? 0;
    if (ing.fixedKg !== undefined) assert.ok(Math.abs(v - ing.fixedKg) <= 1e-6 * p.batchKg, `${label}: fixed ${ing.id}`);
    if (ing.minKg !== undefined) assert.ok(v >= ing.minKg - 1e-6 * p.batchKg, `${label}: min ${ing.id}`);
    if (ing.maxKg !== undefined) assert.ok(v <= ing.maxKg + 1e-6 * p.batchKg, `${label}: max ${ing.id}`);
  }
}

describe('cross-check with HiGHS on generated problems', () => {
  let highs: LpSolver;
  before(async () => {
    highs = await getHighsSolver();
  });

  test(`${N} problems: same status, costs within 1e-6, duals and ranging equal where unique`, () => {
    const seen: Record<string, number> = {};
    let dualChecks = 0;
    let infeasibleChecks = 0;
    for (let i = 0; i < N; i++) {
      const { variant, problem } = suiteProblem(i);
      const p = formulaProblemSchema.parse(problem);
      const label = `#${i} (${variant})`;
      const r = solveFormula(p, { trusted: true });
      const model = buildFormulaModel(p);
      const h = highs.solve(model.lp, { costRanging: true });
      seen[`${variant}/${r.status}`] = (seen[`${variant}/${r.status}`] ?? 0) + 1;
      if (r.status === 'optimal') {
        assert.equal(h.status, 'optimal', label);
        if (h.status !== 'optimal') continue;
        assert.ok(rel(r.costPerKg, h.objective) <= 1e-6 * Math.max(1, h.objective), `${label}: cost ${r.costPerKg} vs HiGHS ${h.objective}`);
        assertMeetsBounds(p, r, label);
        const js = simplexJs.solve(model.lp);
        // Unique optimum only: no basic variable at a bound (unique duals) and no tie (unique mix and ranging).
        if (js.status !== 'optimal' || h.degenerate || js.degenerate || h.alternativeOptima || js.alternativeOptima) continue;
        dualChecks++;
        const ref = reportMix(model, h.colValue, h);
        ref.nutrients.forEach((n, k) => assert.ok(close(r.nutrients[k].shadowPrice, n.shadowPrice), `${label}: shadow ${n.id} ${r.nutrients[k].shadowPrice} vs ${n.shadowPrice}`));
        ref.ratios.forEach((n, k) => assert.ok(close(r.ratios[k].shadowPrice, n.shadowPrice), `${label}: ratio ${n.id}`));
        ref.groups.forEach((n, k) => assert.ok(close(r.groups[k].shadowPrice, n.shadowPrice), `${label}: group ${n.id}`));
        ref.inclusions.forEach((n, k) => assert.ok(close(r.inclusions[k].shadowPrice, n.shadowPrice), `${label}: inclusion ${n.id}`));
        const hr = rangingReport(model, h);
        hr.forEach((x, k) => {
          const y = r.ranging[k] as Record<string, number | null | boolean | string>;
          const xx = x as Record<string, number | null | boolean | string>;
          for (const key of ['lowPrice', 'highPrice', 'entersAtPrice']) {
            if (key in xx) assert.ok(close(y[key] as number | null, xx[key] as number | null, 1e-5), `${label}: ${x.id} ${key} ${y[key]} vs HiGHS ${xx[key]}`);
          }
        });
      } else if (r.status === 'infeasible') {
        assert.equal(h.status, 'infeasible', label);
        infeasibleChecks++;
        // The cheapest relaxation: both solvers find the same minimum total move.
        // (Nutrient and ratio bounds first; ingredient and group limits only when those cannot help.)
        let em = buildElastic(model, false);
        if (highs.solve(em.lp).status === 'infeasible') em = buildElastic(model, true);
        const a = simplexJs.solve(em.lp);
        const b = highs.solve(em.lp);
        assert.ok(a.status === 'optimal' && b.status === 'optimal', label);
        if (a.status === 'optimal' && b.status === 'optimal') assert.ok(rel(a.objective, b.objective) <= 1e-6, `${label}: relaxation ${a.objective} vs ${b.objective}`);
        assert.ok(r.relaxations.length > 0, `${label}: no relaxation reported`);
        // Moving the reported bounds by the reported amounts makes the problem feasible for HiGHS.
        const relaxed = structuredClone(p);
        for (const x of r.relaxations) {
          const pad = x.by * 1e-6 + 1e-9;
          const move = (x.side === 'min' ? -1 : 1) * (x.by + pad);
          if (x.kind === 'nutrient') {
            const nb = relaxed.nutrients.find((n) => n.id === x.id)!;
            if (x.side === 'min') nb.min = nb.min! + move;
            else nb.max = nb.max! + move;
          } else if (x.kind === 'ratio') {
            const ra = relaxed.ratios.find((q) => (q.id ?? `${q.numerator}:${q.denominator}`) === x.id)!;
            if (x.side === 'min') ra.min = Math.max(0, ra.min! + move);
            else ra.max = ra.max! + move;
          } else if (x.kind === 'group') {
            const g = relaxed.groups.find((q) => q.id === x.id)!;
            if (x.side === 'min') g.minKg = Math.max(0, g.minKg! + move);
            else g.maxKg = g.maxKg! + move;
          } else {
            const ing = relaxed.ingredients.find((q) => q.id === x.id)!;
            if (ing.fixedKg !== undefined) ing.fixedKg = x.reaches;
            else if (x.side === 'min') ing.minKg = Math.max(0, (ing.minKg ?? 0) + move);
            else ing.maxKg = (ing.maxKg ?? 0) + move;
          }
        }
        assert.equal(highs.solve(buildFormulaModel(relaxed).lp).status, 'optimal', `${label}: relaxed problem still infeasible`);
      } else {
        assert.fail(`${label}: unexpected status ${r.status} ${JSON.stringify(r).slice(0, 300)}`);
      }
    }
    const total = Object.values(seen).reduce((a, b) => a + b, 0);
    assert.ok(total >= 200, `only ${total} problems`);
    assert.ok(infeasibleChecks >= 30, `too few infeasible cases: ${JSON.stringify(seen)}`);
    assert.ok((seen['degenerate/optimal'] ?? 0) >= 30, `too few degenerate cases: ${JSON.stringify(seen)}`);
    assert.ok(dualChecks >= 40, `too few unique-dual comparisons: ${dualChecks}`);
    process.stdout.write(`# cross-check: ${JSON.stringify(seen)}, unique-dual comparisons ${dualChecks}\n`);
  });
});
