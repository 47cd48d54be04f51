/**
 * Infeasibility explained: the cheapest set of relaxations, by an elastic model.
 *
 * Nutrient and ratio bounds get non-negative slacks that may move them, at a penalty per
 * unit of move measured relative to the bound (a 1 % shortfall of crude protein and a 1 %
 * shortfall of lysine weigh the same). Ingredient and group limits stay hard unless no
 * nutrient move can help (minimums above the batch, say); then they may move too, at a
 * penalty per 1 % of the batch.
 * Phase A minimises the total weighted move; phase B keeps that minimum and finds the
 * least-cost mix among those, so the closest mix is also the cheapest such mix. The
 * duals of phase A name the bounds that conflict with the relaxed ones.
 */
import type { InfeasibleResult, Relaxation } from '../schemas/formulation';
import { fmt, withUnit } from './format';
import { nutrientOf, type FormulaModel, type RowRef } from './formula-model';
import type { LinearProgram, LpSolver } from './lp-types';
import { reportMix } from './report';

/** What an elastic slack relaxes. */
type ElasticRef =
  | { kind: 'row'; row: number; side: 'min' | 'max' }
  | { kind: 'column'; col: number; side: 'min' | 'max' };

/** The elastic model of a formula (exported for cross-checking against another solver). */
export interface ElasticModel {
  lp: LinearProgram;
  weights: number[];
  elastic: ElasticRef[];
  /** LP column of each elastic slack. */
  elasticCols: number[];
  /** For each elastic-LP row: origin (original row index, or column-bound row). */
  origin: ({ kind: 'row'; row: number } | { kind: 'column'; col: number })[];
}

function normOfRow(model: FormulaModel, i: number): number {
  const ref = model.rowRefs[i];
  const lp = model.lp;
  let amax = 0;
  for (const a of lp.rows[i].value) amax = Math.max(amax, Math.abs(a));
  if (ref.kind === 'nutrient') {
    const b = Math.max(Math.abs(Number.isFinite(lp.rowLower[i]) ? lp.rowLower[i] : 0), Math.abs(Number.isFinite(lp.rowUpper[i]) ? lp.rowUpper[i] : 0));
    return Math.max(b, 1e-3 * amax, 1e-12);
  }
  if (ref.kind === 'ratio') return Math.max(amax, 1e-12);
  return 1;
}

/**
 * Build the elastic (phase A) model of a formula: user bounds may move at a relative penalty.
 * @param moveLimits also let ingredient and group limits move (otherwise only nutrient and
 *   ratio bounds do, and the limits stay hard).
 */
export function buildElastic(model: FormulaModel, moveLimits = true): ElasticModel {
  const src = model.lp;
  const n = src.colCost.length;
  const lp: LinearProgram = {
    colNames: [...src.colNames],
    colCost: new Array(n).fill(0),
    colLower: new Array(n).fill(0),
    colUpper: new Array(n).fill(Infinity),
    rowNames: [],
    rowLower: [],
    rowUpper: [],
    rows: [],
  };
  const weights: number[] = [];
  const elastic: ElasticRef[] = [];
  const elasticCols: number[] = [];
  const origin: ElasticModel['origin'] = [];
  const addElastic = (row: { index: number[]; value: number[] }, coef: number, w: number, ref: ElasticRef) => {
    const c = lp.colCost.length;
    lp.colNames.push(`relax:${lp.rowNames[lp.rowNames.length - 1]}:${ref.side}`);
    lp.colCost.push(w);
    lp.colLower.push(0);
    lp.colUpper.push(Infinity);
    row.index.push(c);
    row.value.push(coef);
    weights.push(w);
    elastic.push(ref);
    elasticCols.push(c);
  };
  src.rows.forEach((r, i) => {
    const row = { index: [...r.index], value: [...r.value] };
    lp.rowNames.push(src.rowNames[i]);
    lp.rowLower.push(src.rowLower[i]);
    lp.rowUpper.push(src.rowUpper[i]);
    lp.rows.push(row);
    origin.push({ kind: 'row', row: i });
    const kind = model.rowRefs[i].kind;
    if (kind === 'batch' || (!moveLimits && kind === 'group')) return;
    const w = 1 / normOfRow(model, i);
    if (Number.isFinite(src.rowLower[i])) addElastic(row, 1, w, { kind: 'row', row: i, side: 'min' });
    if (Number.isFinite(src.rowUpper[i])) addElastic(row, -1, w, { kind: 'row', row: i, side: 'max' });
  });
  for (let j = 0; j < n; j++) {
    const lo = src.colLower[j];
    const up = src.colUpper[j];
    if (lo <= 0 && up === Infinity) continue;
    const row = { index: [j], value: [1] };
    lp.rowNames.push(`ingredients[${src.colNames[j]}]`);
    lp.rowLower.push(lo > 0 ? lo : -Infinity);
    lp.rowUpper.push(up);
    lp.rows.push(row);
    origin.push({ kind: 'column', col: j });
    if (!moveLimits) continue;
    if (lo > 0) addElastic(row, 1, 1, { kind: 'column', col: j, side: 'min' });
    if (up !== Infinity) addElastic(row, -1, 1, { kind: 'column', col: j, side: 'max' });
  }
  return { lp, weights, elastic, elasticCols, origin };
}

function label(model: FormulaModel, ref: RowRef | { kind: 'column'; col: number }): { constraint: string; kind: Relaxation['kind']; id: string; name: string; unit?: string } {
  const p = model.problem;
  switch (ref.kind) {
    case 'nutrient': {
      const nb = p.nutrients[ref.index];
      return { constraint: `nutrients[${nb.id}]`, kind: 'nutrient', id: nb.id, name: nb.name ?? nb.id, unit: nb.unit };
    }
    case 'ratio': {
      const r = p.ratios[ref.index];
      const id = model.ratioIds[ref.index];
      return { constraint: `ratios[${id}]`, kind: 'ratio', id, name: r.name ?? `${r.numerator} : ${r.denominator}`, unit: r.unit };
    }
    case 'group': {
      const g = p.groups[ref.index];
      return { constraint: `groups[${g.id}]`, kind: 'group', id: g.id, name: g.name ?? `group ${g.id}`, unit: 'kg' };
    }
    case 'column': {
      const ing = p.ingredients[ref.col];
      return { constraint: `ingredients[${ing.id}]`, kind: 'ingredient', id: ing.id, name: ing.name ?? ing.id, unit: 'kg' };
    }
    default:
      return { constraint: 'batchKg', kind: 'ingredient', id: 'batch', name: 'batch total', unit: 'kg' };
  }
}

function sideKey(kind: Relaxation['kind'], side: 'min' | 'max', model: FormulaModel, ref: ElasticRef): string {
  if (kind === 'group') return side === 'min' ? 'minKg' : 'maxKg';
  if (kind === 'ingredient') {
    const lim = model.limits[(ref as { col: number }).col];
    if (lim.fixed) return 'fixedKg';
    return side === 'min' ? (lim.lowerSource ?? 'minKg') : (lim.upperSource ?? 'maxKg');
  }
  return side;
}

/**
 * Explain why a formula has no feasible mix.
 * @returns the infeasible result, or `feasible` when the elastic model needs no move at
 *   all (the first solve was wrong), with the least-cost shares found.
 */
export function diagnoseFormula(
  model: FormulaModel,
  solver: LpSolver,
): { kind: 'infeasible'; result: InfeasibleResult } | { kind: 'feasible'; x: Float64Array } {
  const p = model.problem;
  const B = p.batchKg;
  // Ingredient and group limits (stock, safety caps, fixed amounts) are kept when moving
  // nutrient and ratio bounds alone can make a mix possible; only otherwise may they move too.
  let em = buildElastic(model, false);
  let a = solver.solve(em.lp);
  if (a.status === 'infeasible') {
    em = buildElastic(model, true);
    a = solver.solve(em.lp);
  }
  if (a.status !== 'optimal') {
    return {
      kind: 'infeasible',
      result: {
        status: 'infeasible',
        message: 'No mix meets the specification, and the relaxation search failed; check that the ingredient limits can add up to the batch.',
        relaxations: [],
        conflict: [],
      },
    };
  }
  const totalMove = a.objective;
  const n = model.lp.colCost.length;
  if (totalMove <= 1e-9) {
    return { kind: 'feasible', x: a.colValue.slice(0, n) };
  }

  // Phase B: keep the smallest total move (a hair of slack for round-off) and minimise cost.
  const lpB: LinearProgram = {
    ...em.lp,
    colCost: em.lp.colCost.map((_, c) => (c < n ? model.lp.colCost[c] : 0)),
    rowNames: [...em.lp.rowNames, 'total-move'],
    rowLower: [...em.lp.rowLower, -Infinity],
    rowUpper: [...em.lp.rowUpper, totalMove * (1 + 1e-9) + 1e-12],
    rows: [...em.lp.rows, { index: [...em.elasticCols], value: [...em.weights] }],
  };
  const b = solver.solve(lpB);
  const xe = b.status === 'optimal' ? b.colValue : a.colValue;
  const x = xe.slice(0, n);

  const relaxations: Relaxation[] = [];
  em.elastic.forEach((ref, e) => {
    const move = xe[em.elasticCols[e]];
    if (move * em.weights[e] <= 1e-9) return;
    relaxations.push(describe(model, ref, x));
  });

  const conflict = new Set<string>();
  for (const r of relaxations) conflict.add(r.constraint);
  em.origin.forEach((o, i) => {
    const d = a.rowDual[i];
    if (Math.abs(d) <= 1e-9) return;
    if (o.kind === 'row') {
      const ref = model.rowRefs[o.row];
      if (ref.kind === 'batch') {
        conflict.add('batchKg');
        return;
      }
      const l = label(model, ref);
      const s = ref.kind === 'ratio' ? ref.side : d > 0 ? 'min' : 'max';
      conflict.add(`${l.constraint}.${sideKey(l.kind, s, model, { kind: 'row', row: o.row, side: s })}`);
    } else {
      const l = label(model, { kind: 'column', col: o.col });
      const s = d > 0 ? 'min' : 'max';
      conflict.add(`${l.constraint}.${sideKey('ingredient', s, model, { kind: 'column', col: o.col, side: s })}`);
    }
  });
  const rep = reportMix(model, x, null);
  const message =
    `No mix meets the specification. Smallest change that makes one possible: ` +
    relaxations.map((r) => r.message).join('; ') +
    '.';
  return {
    kind: 'infeasible',
    result: {
      status: 'infeasible',
      message,
      relaxations,
      conflict: [...conflict],
      closestMix: { costPerBatch: rep.costPerKg * B, mix: rep.mix, nutrients: rep.nutrients },
    },
  };
}

function describe(model: FormulaModel, ref: ElasticRef, x: ArrayLike<number>): Relaxation {
  const p = model.problem;
  const B = p.batchKg;
  if (ref.kind === 'column') {
    const l = label(model, { kind: 'column', col: ref.col });
    const lim = model.limits[ref.col];
    const kg = x[ref.col] * B;
    const bound = ref.side === 'min' ? lim.lowerKg : lim.upperKg;
    const key = sideKey('ingredient', ref.side, model, ref);
    return {
      constraint: `${l.constraint}.${key}`,
      kind: 'ingredient',
      id: l.id,
      side: ref.side,
      bound,
      reaches: kg,
      by: Math.abs(bound - kg),
      message:
        ref.side === 'min'
          ? `${l.name} ${key} ${fmt(bound)} kg cannot be used; the closest mix takes ${fmt(kg)} kg`
          : `${l.name} ${key} ${fmt(bound)} kg is too little; the closest mix needs ${fmt(kg)} kg`,
    };
  }
  const rref = model.rowRefs[ref.row];
  const l = label(model, rref);
  if (rref.kind === 'nutrient') {
    const nb = p.nutrients[rref.index];
    let v = 0;
    p.ingredients.forEach((ing, j) => (v += nutrientOf(ing, nb.id) * x[j]));
    const bound = (ref.side === 'min' ? nb.min : nb.max) as number;
    return {
      constraint: `${l.constraint}.${ref.side}`,
      kind: 'nutrient',
      id: l.id,
      side: ref.side,
      bound,
      reaches: v,
      by: Math.abs(bound - v),
      message:
        ref.side === 'min'
          ? `${l.name} min ${withUnit(bound, l.unit)} cannot be met with these ingredients; the closest mix reaches ${withUnit(v, l.unit)}`
          : `${l.name} max ${withUnit(bound, l.unit)} cannot be kept with these ingredients; the closest mix has ${withUnit(v, l.unit)}`,
    };
  }
  if (rref.kind === 'ratio') {
    const r = p.ratios[rref.index];
    const f = r.factor ?? 1;
    let num = 0;
    let den = 0;
    p.ingredients.forEach((ing, j) => {
      num += nutrientOf(ing, r.numerator) * x[j];
      den += nutrientOf(ing, r.denominator) * x[j];
    });
    const v = den !== 0 ? (f * num) / den : NaN;
    const bound = (ref.side === 'min' ? r.min : r.max) as number;
    return {
      constraint: `${l.constraint}.${ref.side}`,
      kind: 'ratio',
      id: l.id,
      side: ref.side,
      bound,
      reaches: v,
      by: Number.isFinite(v) ? Math.abs(bound - v) : bound,
      message:
        ref.side === 'min'
          ? `${l.name} min ${fmt(bound)} cannot be met; the closest mix reaches ${fmt(v)}`
          : `${l.name} max ${fmt(bound)} cannot be kept; the closest mix has ${fmt(v)}`,
    };
  }
  // group
  const gi = (rref as { index: number }).index;
  const gl = model.groupLimits[gi];
  let share = 0;
  for (const j of gl.members) share += x[j];
  const kg = share * B;
  const bound = (ref.side === 'min' ? gl.minKg : gl.maxKg) as number;
  const key = ref.side === 'min' ? 'minKg' : 'maxKg';
  return {
    constraint: `${l.constraint}.${key}`,
    kind: 'group',
    id: l.id,
    side: ref.side,
    bound,
    reaches: kg,
    by: Math.abs(bound - kg),
    message:
      ref.side === 'min'
        ? `${l.name} min ${fmt(bound)} kg cannot be met; the closest mix has ${fmt(kg)} kg`
        : `${l.name} max ${fmt(bound)} kg cannot be kept; the closest mix needs ${fmt(kg)} kg`,
  };
}
