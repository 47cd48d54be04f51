/**
 * "What is this ingredient worth in this diet": re-solve over a range of its price.
 *
 * The grid points are warm re-solves of one javascript-lp-solver tableau (only a cost
 * changes, so the last optimum stays feasible and phase 2 resumes from it). The exact
 * breakpoints come from cost ranging: inside a ranging interval the mix does not change,
 * so walking from one interval's top to the next visits every change of inclusion.
 */
import {
  priceSweepSchema,
  type PriceSweepOutcome,
  type PriceSweepProblem,
  type SweepPoint,
} from '../schemas/formulation';
import { fieldErrors } from './format';
import { buildFormulaModel } from './formula-model';
import { DEFAULT_TOLERANCE } from './formulate';
import { maxScaledViolation, type LpOutcome } from './lp-types';
import { createSimplexJsModel } from './simplex-js';

const MAX_BREAKPOINTS = 200;

/**
 * Sweep the price of one ingredient.
 * @param input `{ problem, ingredient, fromPrice, toPrice, steps? }` (prices per kg; steps 2–201, default 21).
 * @returns `swept` with cost per batch and the ingredient's kg and % at each price (null where no
 *   mix exists), the exact prices where its inclusion changes between the ends (`breakpoints`), and
 *   `entersAtPrice`, the highest price at which it is used at all (null if never); or `invalid`.
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

  const solveAt = (price: number, ranging = false): LpOutcome => {
    if ('status' in handle) return handle;
    handle.setCost(j, price);
    const o = handle.solve({ costRanging: ranging });
    if (o.status === 'optimal' && maxScaledViolation(model.lp, o.colValue).violation > tol) {
      return { status: 'error', message: 'mix failed the bound check' };
    }
    return o;
  };

  const points: SweepPoint[] = [];
  for (let s = 0; s < steps; s++) {
    const price = sp.fromPrice + ((sp.toPrice - sp.fromPrice) * s) / (steps - 1);
    const o = solveAt(price);
    if (o.status !== 'optimal') {
      points.push({ pricePerKg: price, status: o.status === 'error' ? 'failed' : o.status, costPerBatch: null, kg: null, percent: null });
      continue;
    }
    points.push({ pricePerKg: price, status: 'optimal', costPerBatch: o.objective * B, kg: o.colValue[j] * B, percent: o.colValue[j] * 100 });
  }

  const breakpoints: number[] = [];
  let entersAtPrice: number | null = null;
  let price = sp.fromPrice;
  // A degenerate optimum can report the same upper end again just above it: step further each time
  // it does, and never list one price twice.
  let nudge = 1e-9;
  for (let k = 0; k < MAX_BREAKPOINTS; k++) {
    const o = solveAt(price, true);
    if (o.status !== 'optimal' || !o.costLow || !o.costHigh) break;
    const inMix = o.colValue[j] * B > 1e-9 * Math.max(1, B);
    if (!inMix) {
      // Out of the mix: it enters when the price falls to the bottom of this interval.
      const low = o.costLow[j];
      entersAtPrice = Number.isFinite(low) && model.limits[j].upperKg > 0 ? low : null;
      break;
    }
    const high = o.costHigh[j];
    // In the mix at any price (a minimum or fixed amount keeps it there): no entering price.
    if (!Number.isFinite(high)) break;
    const last = breakpoints[breakpoints.length - 1];
    const repeated = last !== undefined && high <= last + 1e-7 * Math.max(1, Math.abs(last));
    if (high < sp.toPrice && !repeated) breakpoints.push(high);
    nudge = repeated ? nudge * 10 : 1e-9;
    if (nudge > 1e-3) break;
    price = Math.max(high, price) + nudge * Math.max(1, Math.abs(high));
  }
  return { status: 'swept', ingredient: sp.ingredient, points, entersAtPrice, breakpoints };
}
