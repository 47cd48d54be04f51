/**
 * Turns a validated formula problem into a {@link LinearProgram}.
 *
 * Variables are shares of the batch (0..1), so every coefficient is a nutrient value
 * per kg as fed or 1, and the batch size only scales results: this keeps the LP
 * well-scaled whatever the batch. Rows:
 *   - `batch`: Σ x = 1 (the mix is the whole batch);
 *   - one row per bounded nutrient: min <= Σ a_j x_j <= max;
 *   - one row per ratio side: Σ (f·num_j − R·den_j) x_j >= 0 (min R) or <= 0 (max R),
 *     the exact linearisation of f·num/den >= R given a positive denominator level;
 *   - one row per bounded group: Σ_{j∈g} x_j within [minKg, maxKg] / batch.
 * Inclusion limits (min, max, fixed, stock) are column bounds.
 */
import type { FormulaProblem, Ingredient } from '../schemas/formulation';
import type { LinearProgram } from './lp-types';

/** What an LP row stands for. */
export type RowRef =
  | { kind: 'batch' }
  | { kind: 'nutrient'; index: number }
  | { kind: 'ratio'; index: number; side: 'min' | 'max' }
  | { kind: 'group'; index: number };

/** Resolved inclusion limits of one ingredient, kg. */
export interface ColumnLimits {
  lowerKg: number;
  upperKg: number;
  /** Which input sets the upper limit (null when unlimited). */
  upperSource: 'maxKg' | 'maxPercent' | 'stockKg' | 'fixedKg' | null;
  lowerSource: 'minKg' | 'minPercent' | 'fixedKg' | null;
  fixed: boolean;
}

/** A formula problem in LP form, with the bookkeeping needed to report on it. */
export interface FormulaModel {
  problem: FormulaProblem;
  lp: LinearProgram;
  rowRefs: RowRef[];
  limits: ColumnLimits[];
  /** Nutrient ids reported: the bounded ones first, then any other found in the ingredients. */
  nutrientIds: string[];
  /** Group bounds resolved to kg. */
  groupLimits: { minKg: number | null; maxKg: number | null; members: number[] }[];
  ratioIds: string[];
}

/** Nutrient value of an ingredient (missing counts as 0). */
export function nutrientOf(ing: Ingredient, id: string): number {
  const v = ing.nutrients[id];
  return typeof v === 'number' ? v : 0;
}

/** Resolve an ingredient's inclusion limits in kg for a batch. */
export function columnLimits(ing: Ingredient, batchKg: number, stockKg?: number): ColumnLimits {
  if (ing.fixedKg !== undefined) {
    return { lowerKg: ing.fixedKg, upperKg: ing.fixedKg, upperSource: 'fixedKg', lowerSource: 'fixedKg', fixed: true };
  }
  let lowerKg = 0;
  let lowerSource: ColumnLimits['lowerSource'] = null;
  if (ing.minKg !== undefined && ing.minKg > 0) {
    lowerKg = ing.minKg;
    lowerSource = 'minKg';
  } else if (ing.minPercent !== undefined && ing.minPercent > 0) {
    lowerKg = (ing.minPercent / 100) * batchKg;
    lowerSource = 'minPercent';
  }
  let upperKg = Infinity;
  let upperSource: ColumnLimits['upperSource'] = null;
  const consider = (v: number | undefined, src: NonNullable<ColumnLimits['upperSource']>) => {
    if (v !== undefined && v < upperKg) {
      upperKg = v;
      upperSource = src;
    }
  };
  consider(ing.maxKg, 'maxKg');
  consider(ing.maxPercent === undefined ? undefined : (ing.maxPercent / 100) * batchKg, 'maxPercent');
  consider(stockKg ?? ing.stockKg, 'stockKg');
  return { lowerKg, upperKg, upperSource, lowerSource, fixed: false };
}

/** Default reading step for a unit: % → 0.1, kcal/kg → 100, MJ/kg → 0.1, else 1. */
export function defaultStep(unit: string | undefined): number {
  switch ((unit ?? '').trim().toLowerCase()) {
    case '%':
      return 0.1;
    case 'kcal/kg':
      return 100;
    case 'mj/kg':
      return 0.1;
    default:
      return 1;
  }
}

/** Ratio id as reported: the given id or "numerator:denominator". */
export function ratioId(r: { id?: string; numerator: string; denominator: string }): string {
  return r.id ?? `${r.numerator}:${r.denominator}`;
}

/**
 * Build the LP of one formula.
 * @param stockOverride per-ingredient stock (kg) replacing `stockKg`, used by allocation diagnosis.
 */
export function buildFormulaModel(problem: FormulaProblem, stockOverride?: Map<string, number>): FormulaModel {
  const B = problem.batchKg;
  const ings = problem.ingredients;
  const n = ings.length;
  const lp: LinearProgram = {
    colNames: ings.map((i) => i.id),
    colCost: ings.map((i) => i.pricePerKg),
    colLower: [],
    colUpper: [],
    rowNames: [],
    rowLower: [],
    rowUpper: [],
    rows: [],
  };
  const limits = ings.map((ing) => columnLimits(ing, B, stockOverride?.get(ing.id)));
  for (const l of limits) {
    lp.colLower.push(l.lowerKg / B);
    lp.colUpper.push(l.upperKg / B);
  }
  const rowRefs: RowRef[] = [];
  const all = [...Array(n).keys()];
  const addRow = (name: string, ref: RowRef, index: number[], value: number[], lo: number, hi: number) => {
    lp.rowNames.push(name);
    lp.rows.push({ index, value });
    lp.rowLower.push(lo);
    lp.rowUpper.push(hi);
    rowRefs.push(ref);
  };
  addRow('batch', { kind: 'batch' }, all, all.map(() => 1), 1, 1);

  problem.nutrients.forEach((nb, k) => {
    if (nb.min === undefined && nb.max === undefined) return;
    const index: number[] = [];
    const value: number[] = [];
    ings.forEach((ing, j) => {
      const a = nutrientOf(ing, nb.id);
      if (a !== 0) {
        index.push(j);
        value.push(a);
      }
    });
    addRow(`nutrients[${nb.id}]`, { kind: 'nutrient', index: k }, index, value, nb.min ?? -Infinity, nb.max ?? Infinity);
  });

  const ratioIds: string[] = [];
  problem.ratios.forEach((r, k) => {
    const id = ratioId(r);
    ratioIds.push(id);
    const f = r.factor ?? 1;
    for (const side of ['min', 'max'] as const) {
      const R = r[side];
      if (R === undefined) continue;
      const index: number[] = [];
      const value: number[] = [];
      ings.forEach((ing, j) => {
        const a = f * nutrientOf(ing, r.numerator) - R * nutrientOf(ing, r.denominator);
        if (a !== 0) {
          index.push(j);
          value.push(a);
        }
      });
      addRow(`ratios[${id}].${side}`, { kind: 'ratio', index: k, side }, index, value, side === 'min' ? 0 : -Infinity, side === 'min' ? Infinity : 0);
    }
  });

  const idIndex = new Map(ings.map((i, j) => [i.id, j]));
  const groupLimits: FormulaModel['groupLimits'] = [];
  problem.groups.forEach((g, k) => {
    const members = g.members.map((m) => idIndex.get(m)).filter((j): j is number => j !== undefined);
    const minKg = g.minKg ?? (g.minPercent !== undefined ? (g.minPercent / 100) * B : null);
    const maxKg = g.maxKg ?? (g.maxPercent !== undefined ? (g.maxPercent / 100) * B : null);
    groupLimits.push({ minKg, maxKg, members });
    if (minKg === null && maxKg === null) return;
    addRow(`groups[${g.id}]`, { kind: 'group', index: k }, members, members.map(() => 1), minKg === null ? -Infinity : minKg / B, maxKg === null ? Infinity : maxKg / B);
  });

  const nutrientIds = problem.nutrients.map((nb) => nb.id);
  const listed = new Set(nutrientIds);
  for (const ing of ings) {
    for (const k of Object.keys(ing.nutrients)) {
      if (!listed.has(k)) {
        listed.add(k);
        nutrientIds.push(k);
      }
    }
  }
  return { problem, lp, rowRefs, limits, nutrientIds, groupLimits, ratioIds };
}
