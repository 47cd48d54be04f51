/**
 * "What is this ingredient worth in this diet": re-solve over a range of its price.
 *
 * The grid points are warm re-solves of one javascript-lp-solver tableau (only a cost
 * changes, so the last optimum stays feasible and phase 2 resumes from it). The exact
 * breakpoints come from cost ranging: inside a ranging interval the mix does not change,
 * so walking from one interval's top to the next visits every change of inclusion.
 *
 * Where the ingredient stands (`entry`) comes from the same walk, carried on past the high end
 * until its amount can fall no further (out of the mix, or an interval with no top): that is
 * the least it is ever used, 0 unless a fixed or minimum inclusion or the specification keeps
 * it in. Inclusion never rises with its own price, so there is at most one price at or below
 * which it is used above that least and above which it is not: ranging gives that price, and a
 * re-solve just above and just below confirms it (bisection takes over if it does not, as can
 * happen at a degenerate optimum, where ranging is conservative). The least and most of it a
 * mix can hold are not solved for directly: an LP with every other cost zero is so degenerate
 * that javascript-lp-solver can cycle on it.
 */
import {
  priceSweepSchema,
  type PriceSweepEntry,
  type PriceSweepOutcome,
  type PriceSweepProblem,
  type SweepPoint,
} from '../schemas/formulation';
import { fieldErrors } from './format';
import { buildFormulaModel } from './formula-model';
import { DEFAULT_TOLERANCE } from './formulate';
import { maxScaledViolation, type LpOutcome } from './lp-types';
import { createSimplexJsModel } from './simplex-js';

/** Re-solves allowed on each walk along the ranging intervals. */
const MAX_STEPS = 400;
/**
 * A share of the batch within this (1 g per tonne) of another counts as the same amount: a change smaller
 * than that is solver noise or a breakpoint no one could weigh, not a change of inclusion.
 */
const SHARE_TOL = 1e-6;
/** Relative step either side of a found price used to confirm it by re-solving. */
const CONFIRM_STEP = 1e-7;

/**
 * Sweep the price of one ingredient.
 * @param input `{ problem, ingredient, fromPrice, toPrice, steps? }` (prices per kg; steps 2–201, default 21).
 * @returns `swept` with cost per batch and the ingredient's kg and % at each price (null where no
 *   mix exists), the same at the problem's own price (`current`), the exact prices where its
 *   inclusion changes between the ends (`breakpoints`), and `entry`, where the ingredient stands
 *   against the range swept (see {@link PriceSweepEntry}); or `invalid`.
 */
export function priceSweep(input: unknown): PriceSweepOutcome {
  const parsed = priceSweepSchema.safeParse(input);
  if (!parsed.success) {
    const errors = fieldErrors(parsed.error.issues);
    return { status: 'invalid', message: `${errors[0].field}: ${errors[0].message}`, errors };
  }
  const sp: PriceSweepProblem = parsed.data;
  const problem = sp.problem;
  const model = buildFormulaModel(problem);
  const j = problem.ingredients.findIndex((i) => i.id === sp.ingredient);
  const B = problem.batchKg;
  const tol = problem.options?.tolerance ?? DEFAULT_TOLERANCE;
  const steps = sp.steps ?? 21;
  const handle = createSimplexJsModel(model.lp);

  const checked = (o: LpOutcome): LpOutcome =>
    o.status === 'optimal' && maxScaledViolation(model.lp, o.colValue).violation > tol ? { status: 'error', message: 'mix failed the bound check' } : o;
  const solveAt = (price: number, ranging = false): LpOutcome => {
    if ('status' in handle) return handle;
    handle.setCost(j, price);
    return checked(handle.solve({ costRanging: ranging }));
  };
  const pointAt = (price: number): SweepPoint => {
    const o = solveAt(price);
    if (o.status !== 'optimal') return { pricePerKg: price, status: o.status === 'error' ? 'failed' : o.status, costPerBatch: null, kg: null, percent: null };
    return { pricePerKg: price, status: 'optimal', costPerBatch: o.objective * B, kg: o.colValue[j] * B, percent: o.colValue[j] * 100 };
  };

  const points: SweepPoint[] = [];
  for (let s = 0; s < steps; s++) points.push(pointAt(sp.fromPrice + ((sp.toPrice - sp.fromPrice) * s) / (steps - 1)));
  const current = pointAt(problem.ingredients[j].pricePerKg);
  const base = { status: 'swept' as const, ingredient: sp.ingredient, fromPrice: sp.fromPrice, toPrice: sp.toPrice, points, current };

  // Walk up the ranging intervals from the low end: every top below the high end is a breakpoint.
  // The walk goes on past the high end until the ingredient's amount can fall no further: out of the
  // mix, or an interval with no top (the same basis, so the same amount, at any higher price). That
  // amount is its least, exactly.
  const breakpoints: number[] = [];
  const seen: { price: number; share: number; high: number }[] = [];
  let end: { price: number; share: number; low: number } | null = null;
  let price = sp.fromPrice;
  // Just past the top of an interval the solver may keep the same basis (the change in reduced cost
  // is within its precision) and report the top as the price it was given, or a degenerate optimum
  // may report the same top again: step further each time it does, and never list one price twice.
  let nudge = 1e-9;
  for (let k = 0; k < MAX_STEPS; k++) {
    const o = solveAt(price, true);
    if (o.status === 'infeasible') return { ...base, entry: { kind: 'no_mix' }, breakpoints: [] };
    if (o.status !== 'optimal' || !o.costLow || !o.costHigh) break;
    const share = o.colValue[j];
    const high = o.costHigh[j];
    if (share <= SHARE_TOL || !Number.isFinite(high)) {
      end = { price, share: share <= SHARE_TOL ? 0 : share, low: o.costLow[j] };
      break;
    }
    seen.push({ price, share, high });
    const last = breakpoints[breakpoints.length - 1];
    const repeated = last !== undefined && high <= last + 1e-7 * Math.max(1, Math.abs(last));
    const stuck = high <= price + 1e-12 * Math.max(1, Math.abs(price));
    if (high < sp.toPrice && !repeated && !stuck) breakpoints.push(high);
    nudge = stuck || repeated ? nudge * 10 : Math.max(1e-9, nudge / 10);
    if (nudge > 1e-3) break;
    price = Math.max(high, price) + nudge * Math.max(1, Math.abs(high));
  }
  if (!end) return { ...base, entry: { kind: 'failed', message: `the solver could not follow the mix as the price of ${sp.ingredient} rises` }, breakpoints };

  const floor = end.share;
  const lim = model.limits[j];
  const always = (risesAbovePrice: number | null): PriceSweepEntry => ({
    kind: 'always_in',
    reason: lim.fixed ? 'fixed' : lim.lowerKg > 0 && floor * B <= lim.lowerKg + SHARE_TOL * B ? 'minimum' : 'required',
    leastKg: floor * B,
    leastPercent: floor * 100,
    risesAbovePrice,
  });
  const lastAbove = seen.filter((x) => x.share > floor + SHARE_TOL).pop();
  const threshold = lim.upperKg <= (floor + SHARE_TOL) * B ? null : findThreshold({
    solveAt,
    above: (o) => o.colValue[j] > floor + SHARE_TOL,
    lowOf: (o) => o.costLow?.[j] ?? -Infinity,
    lastAbove: lastAbove?.price ?? null,
    // The top of the last interval that uses more, or the bottom of the first at its least: the same price
    // unless the steps between them are too small to count.
    candidates: lastAbove ? [end.low, lastAbove.high] : [end.low],
    atLeast: end.price,
  });
  if (threshold === 'failed') return { ...base, entry: { kind: 'failed', message: `the price at which ${sp.ingredient} enters could not be confirmed by re-solving` }, breakpoints };
  let entry: PriceSweepEntry;
  // No price moves it: fixed, kept out by its limits or the specification, or pinned by the specification.
  if (threshold === null) entry = floor > 0 ? always(null) : { kind: 'never_in_range', entersAtPrice: null };
  else if (floor > 0) entry = always(threshold);
  else if (threshold < sp.fromPrice) entry = { kind: 'never_in_range', entersAtPrice: threshold };
  else if (threshold > sp.toPrice) entry = { kind: 'in_throughout_range', leavesAbovePrice: threshold };
  else entry = { kind: 'enters_in_range', price: threshold };
  return { ...base, entry, breakpoints };
}

type Optimal = Extract<LpOutcome, { status: 'optimal' }>;

/**
 * The price at or below which the ingredient is used above its least amount, and above which it is
 * not (inclusion never rises with the ingredient's own price, so there is one such price at most).
 * `atLeast` is a price known to hold it at its least, `low` the bottom of its ranging interval there,
 * `lastAbove` a price known to use more (null if none yet). With no such price yet, it walks down the
 * ranging intervals until one uses more (or an interval with no bottom proves none ever does: null).
 * The ranging price is kept when a re-solve just below uses more and one just above does not;
 * otherwise the price is bisected between the two. 'failed' if the solver fails.
 */
function findThreshold(a: {
  solveAt: (price: number, ranging?: boolean) => LpOutcome;
  above: (o: Optimal) => boolean;
  lowOf: (o: Optimal) => number;
  lastAbove: number | null;
  candidates: number[];
  atLeast: number;
}): number | null | 'failed' {
  const step = (p: number) => CONFIRM_STEP * Math.max(1, Math.abs(p));
  let lo = a.lastAbove;
  let hi = a.atLeast;
  const candidates = [...a.candidates];
  let candidate = candidates[0];
  // As on the way up, a degenerate optimum can report a bottom that is no lower: step further each time.
  let nudge = CONFIRM_STEP;
  for (let k = 0; lo === null && k < MAX_STEPS; k++) {
    // The same basis at every lower price: its amount never changes, whatever the price.
    if (!Number.isFinite(candidate)) return null;
    const p = Math.min(candidate, hi) - nudge * Math.max(1, Math.abs(candidate));
    const o = a.solveAt(p, true);
    if (o.status !== 'optimal') return 'failed';
    if (a.above(o)) lo = p;
    else {
      const next = a.lowOf(o);
      nudge = next >= p - step(p) ? nudge * 10 : CONFIRM_STEP;
      if (nudge > 1e6) return 'failed';
      hi = p;
      candidate = next;
      candidates.push(next);
    }
  }
  if (lo === null) return 'failed';
  const test = (price: number): boolean | null => {
    const o = a.solveAt(price);
    return o.status === 'optimal' ? a.above(o) : null;
  };
  for (const c of candidates) {
    if (Number.isFinite(c) && c >= lo && c <= hi && test(c - step(c)) === true && test(c + step(c)) === false) return c;
  }
  let [low, high] = [lo, hi];
  for (let k = 0; k < 200 && high - low > 1e-10 * Math.max(1, Math.abs(low), Math.abs(high)); k++) {
    const mid = (low + high) / 2;
    const t = test(mid);
    if (t === null) return 'failed';
    if (t) low = mid;
    else high = mid;
  }
  return (low + high) / 2;
}
