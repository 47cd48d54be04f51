/**
 * Nutrient, ratio, group and inclusion reports for a mix, with shadow prices when
 * duals are given. All levels are recomputed from the amounts (never taken from a
 * solver), so a report always describes the mix it sits beside.
 *
 * Dual units: the LP works in shares of the batch and cost per kg of feed, so a row
 * dual is d(cost per kg)/d(bound). Per batch that is × batchKg; per tonne × 1000. For
 * kg-valued bounds (groups, inclusions) the batch factors cancel: the LP dual is
 * already the change in cost per batch per kg of bound.
 */
import type {
  BindingSide,
  GroupReport,
  InclusionReport,
  MixLine,
  NutrientReport,
  RatioReport,
  ReadablePrice,
  SolvedFormulaFields,
} from '../schemas/formulation';
import { clean, fmt, money } from './format';
import { defaultStep, nutrientOf, type FormulaModel } from './formula-model';

/** Duals of a solved {@link FormulaModel} LP, in LP units (see file comment). */
export interface ModelDuals {
  rowDual: ArrayLike<number>;
  colDual: ArrayLike<number>;
}

export interface MixReport {
  costPerKg: number;
  mix: MixLine[];
  nutrients: NutrientReport[];
  ratios: RatioReport[];
  groups: GroupReport[];
  inclusions: InclusionReport[];
}

/**
 * The part of a result that every solved formula shares (single or in an allocation): batch, costs in kg,
 * tonne and batch terms, the mix and the levels achieved.
 */
export function solvedFormulaFields(rep: MixReport, batchKg: number): SolvedFormulaFields {
  return {
    batchKg,
    costPerKg: rep.costPerKg,
    costPerTonne: rep.costPerKg * 1000,
    costPerBatch: rep.costPerKg * batchKg,
    mix: rep.mix,
    nutrients: rep.nutrients,
    ratios: rep.ratios,
    groups: rep.groups,
  };
}

/** Index of the LP row of each nutrient / ratio side / group (-1 when it has none). */
export function rowIndexes(model: FormulaModel) {
  const nutrient = new Array(model.problem.nutrients.length).fill(-1);
  const ratioMin = new Array(model.problem.ratios.length).fill(-1);
  const ratioMax = new Array(model.problem.ratios.length).fill(-1);
  const group = new Array(model.problem.groups.length).fill(-1);
  model.rowRefs.forEach((ref, i) => {
    if (ref.kind === 'nutrient') nutrient[ref.index] = i;
    else if (ref.kind === 'ratio') (ref.side === 'min' ? ratioMin : ratioMax)[ref.index] = i;
    else if (ref.kind === 'group') group[ref.index] = i;
  });
  return { nutrient, ratioMin, ratioMax, group };
}

function near(a: number, b: number, tol: number): boolean {
  return Math.abs(a - b) <= tol;
}

function side(value: number, min: number | null, max: number | null, tol: number, dual: number): BindingSide {
  const atMin = min !== null && near(value, min, tol);
  const atMax = max !== null && near(value, max, tol);
  if (atMin && atMax) return dual < 0 ? 'max' : 'min';
  if (atMin) return 'min';
  if (atMax) return 'max';
  return null;
}

/**
 * Report a mix given as shares of the batch `x` (Σ x = 1 for a full batch).
 * @param duals LP duals, or null for no shadow prices (evaluation).
 * @param tolRel relative tolerance used to call a bound binding.
 */
export function reportMix(model: FormulaModel, x: ArrayLike<number>, duals: ModelDuals | null, tolRel = 1e-7): MixReport {
  const p = model.problem;
  const B = p.batchKg;
  const ings = p.ingredients;
  const rows = rowIndexes(model);
  const rd = (i: number) => (duals && i >= 0 ? duals.rowDual[i] : 0);

  let costPerKg = 0;
  const mix: MixLine[] = [];
  ings.forEach((ing, j) => {
    const share = x[j];
    costPerKg += ing.pricePerKg * share;
    if (share * B > 1e-9 * Math.max(1, B)) {
      const kg = share * B;
      mix.push({ id: ing.id, ...(ing.name ? { name: ing.name } : {}), kg, percent: share * 100, pricePerKg: ing.pricePerKg, cost: kg * ing.pricePerKg });
    }
  });

  const level = (id: string) => {
    let s = 0;
    for (let j = 0; j < ings.length; j++) s += nutrientOf(ings[j], id) * x[j];
    return s;
  };
  const rowScale = (id: string) => {
    let m = 0;
    for (const ing of ings) m = Math.max(m, Math.abs(nutrientOf(ing, id)));
    return m || 1;
  };

  const bounds = new Map(p.nutrients.map((nb, k) => [nb.id, { nb, k }]));
  const nutrients: NutrientReport[] = model.nutrientIds.map((id) => {
    const entry = bounds.get(id);
    const value = level(id);
    if (!entry) {
      return { id, value, min: null, max: null, binding: null, shadowPrice: 0, shadowPricePerTonne: 0 };
    }
    const { nb, k } = entry;
    const dual = clean(rd(rows.nutrient[k]), 1e-12);
    const min = nb.min ?? null;
    const max = nb.max ?? null;
    const binding = side(value, min, max, tolRel * rowScale(id) + 1e-12, dual);
    const r: NutrientReport = {
      id,
      ...(nb.name ? { name: nb.name } : {}),
      ...(nb.unit ? { unit: nb.unit } : {}),
      value,
      min,
      max,
      binding,
      shadowPrice: dual * B,
      shadowPricePerTonne: dual * 1000,
    };
    if (duals && dual !== 0) r.readable = readable(nb.name ?? id, nb.unit, nb.step ?? defaultStep(nb.unit), dual * 1000, binding);
    return r;
  });

  const ratios: RatioReport[] = p.ratios.map((r, k) => {
    const f = r.factor ?? 1;
    const num = level(r.numerator);
    const den = level(r.denominator);
    const value = den !== 0 ? (f * num) / den : null;
    const iMin = rows.ratioMin[k];
    const iMax = rows.ratioMax[k];
    // A ratio row's dual is per unit of its linearised row; × denominator level gives cost per unit of ratio.
    const dual = clean(rd(iMin) + rd(iMax), 1e-12) * den;
    let binding: BindingSide = null;
    if (value !== null) {
      let scale = 0;
      for (const ing of ings) scale = Math.max(scale, Math.abs(f * nutrientOf(ing, r.numerator)), Math.abs((r.min ?? r.max ?? 0) * nutrientOf(ing, r.denominator)));
      const tolRatio = ((tolRel * (scale || 1)) / Math.abs(den)) + 1e-12;
      binding = side(value, r.min ?? null, r.max ?? null, tolRatio, dual);
    }
    return {
      id: model.ratioIds[k],
      numerator: r.numerator,
      denominator: r.denominator,
      factor: f,
      value,
      min: r.min ?? null,
      max: r.max ?? null,
      binding,
      shadowPrice: dual * B,
      shadowPricePerTonne: dual * 1000,
    };
  });

  const groups: GroupReport[] = p.groups.map((g, k) => {
    const gl = model.groupLimits[k];
    let share = 0;
    for (const j of gl.members) share += x[j];
    const kg = share * B;
    const dual = clean(rd(rows.group[k]), 1e-12);
    return {
      id: g.id,
      ...(g.name ? { name: g.name } : {}),
      kg,
      percent: share * 100,
      minKg: gl.minKg,
      maxKg: gl.maxKg,
      binding: side(kg, gl.minKg, gl.maxKg, tolRel * B + 1e-9, dual),
      shadowPrice: dual,
      shadowPricePerTonnePerPercent: dual * 10,
    };
  });

  const inclusions: InclusionReport[] = [];
  ings.forEach((ing, j) => {
    const lim = model.limits[j];
    if (lim.lowerKg === 0 && lim.upperKg === Infinity) return;
    const kg = x[j] * B;
    const dual = duals ? clean(duals.colDual[j], 1e-12) : 0;
    const tolKg = tolRel * B + 1e-9;
    let binding: BindingSide = null;
    if (lim.fixed) binding = dual < 0 ? 'max' : 'min';
    else if (lim.lowerKg > 0 && near(kg, lim.lowerKg, tolKg)) binding = 'min';
    else if (lim.upperKg !== Infinity && near(kg, lim.upperKg, tolKg)) binding = 'max';
    inclusions.push({
      id: ing.id,
      kg,
      minKg: lim.fixed ? null : lim.lowerKg > 0 ? lim.lowerKg : null,
      maxKg: ing.maxKg ?? (ing.maxPercent !== undefined ? (ing.maxPercent / 100) * B : null),
      fixedKg: ing.fixedKg ?? null,
      stockKg: lim.upperSource === 'stockKg' ? lim.upperKg : (ing.stockKg ?? null),
      binding,
      limitedBy: binding === 'max' ? lim.upperSource : binding === 'min' ? lim.lowerSource : null,
      shadowPrice: dual,
      shadowPricePerTonnePerPercent: dual * 10,
    });
  });

  return { costPerKg, mix, nutrients, ratios, groups, inclusions };
}

function readable(label: string, unit: string | undefined, step: number, perTonnePerUnit: number, binding: BindingSide): ReadablePrice {
  const costPerTonne = perTonnePerUnit * step;
  const u = unit ?? 'unit(s)';
  const what = binding === 'max' ? `allowed` : `required`;
  const verb = costPerTonne >= 0 ? 'adds' : 'saves';
  return {
    step,
    unit: u,
    costPerTonne,
    text: `Each ${fmt(step)} ${u} more ${label} ${what} ${verb} ${money(Math.abs(costPerTonne))} per tonne of feed.`,
  };
}
