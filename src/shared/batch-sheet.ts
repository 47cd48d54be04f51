/**
 * A batch sheet from an approved mix: each ingredient's amount for the batch to be made, rounded to what
 * the scale reads, grouped by how it goes into the mixer, in a suggested order of addition.
 *
 * Units: the batch size, the steps and every amount are in one mass unit (kg or lb, the organization's);
 * shares are % of the batch as fed. Pure: no framework imports.
 *
 * Rounding keeps the total: minor ingredients are rounded to the small scale's step; the major ones
 * share what is left with the largest-remainder method on the main scale's step, so the amounts add up
 * to the batch size within half a main-scale step (exactly when every line is on the main scale and the
 * batch is a multiple of its step).
 */
import type { IngredientCategory } from './library-terms';
import { stepDecimals } from './measures';

/** How an ingredient goes into the mixer. `macro`: main scale, first; `minor`: small scale, premix and hand-adds; `liquid`: fats and oils, last. */
export type AdditionGroup = 'macro' | 'minor' | 'liquid';

export const ADDITION_GROUP_LABELS: Record<AdditionGroup, string> = {
  macro: 'Major ingredients (main scale)',
  minor: 'Minor ingredients and premix (small scale)',
  liquid: 'Liquids (fats and oils), added last',
};

/** One line of the approved mix. */
export type SheetIngredient = { id: string; name: string; category: IngredientCategory; percent: number };

export type BatchSheetOptions = {
  /** The batch to make, in the sheet's mass unit; > 0. */
  batchSize: number;
  /** Step the main scale reads, in the sheet's unit (default 0.5). */
  macroStep?: number;
  /** Step the small scale reads, in the sheet's unit (default 0.01). */
  minorStep?: number;
  /**
   * Minerals and synthetic amino acids at or below this share of the batch, %, go on the small scale
   * (default 2). Premix always does.
   */
  minorMaxPercent?: number;
  /** An ingredient whose amount is below this many main-scale steps also goes on the small scale (default 20: rounding then moves it by at most 2.5 %). */
  minorBelowSteps?: number;
};

export type SheetLine = {
  id: string;
  name: string;
  category: IngredientCategory;
  group: AdditionGroup;
  /** 1, 2, 3… the suggested order of addition. */
  order: number;
  percent: number;
  /** Share × batch, unrounded. */
  exact: number;
  /** What to weigh: a multiple of `step`. */
  amount: number;
  step: number;
  /** Decimals that show `amount` exactly. */
  decimals: number;
  /** Why this line needs attention at the mixer, or null. */
  callOut: string | null;
};

export type BatchSheet = {
  batchSize: number;
  lines: SheetLine[];
  /** Sum of the rounded amounts. */
  total: number;
  /** total − batchSize; |difference| ≤ macroStep / 2. */
  difference: number;
  macroStep: number;
  minorStep: number;
};

const MINOR_CATEGORIES: readonly IngredientCategory[] = ['premix', 'mineral', 'synthetic_amino_acid'];
const GROUP_ORDER: AdditionGroup[] = ['macro', 'minor', 'liquid'];

/** Which group an ingredient goes in for a batch of `batchSize` (see BatchSheetOptions). */
export function additionGroup(item: SheetIngredient, batchSize: number, options: Omit<BatchSheetOptions, 'batchSize'> = {}): AdditionGroup {
  const macroStep = options.macroStep ?? 0.5;
  if (item.category === 'fat_and_oil') return 'liquid';
  if (item.category === 'premix') return 'minor';
  if (MINOR_CATEGORIES.includes(item.category) && item.percent <= (options.minorMaxPercent ?? 2)) return 'minor';
  if ((item.percent / 100) * batchSize < (options.minorBelowSteps ?? 20) * macroStep) return 'minor';
  return 'macro';
}

/** Rounds to a multiple of `step` without binary noise (0.1 + 0.2 stays 0.3). */
const onStep = (units: number, step: number) => Number((units * step).toFixed(stepDecimals(step)));

/**
 * The batch sheet. Lines with a share of 0 are left out; shares are scaled so they add up to 100 %
 * (an approved mix does, within the solver's tolerance).
 */
export function buildBatchSheet(mix: readonly SheetIngredient[], options: BatchSheetOptions): BatchSheet {
  const { batchSize } = options;
  const macroStep = options.macroStep ?? 0.5;
  const minorStep = options.minorStep ?? 0.01;
  if (!(batchSize > 0)) throw new RangeError('batchSize must be more than 0');
  if (!(macroStep > 0) || !(minorStep > 0)) throw new RangeError('scale steps must be more than 0');
  const used = mix.filter((m) => m.percent > 0);
  const shareTotal = used.reduce((s, m) => s + m.percent, 0);
  if (shareTotal <= 0) throw new RangeError('the mix has no ingredient');

  const items = used.map((m) => {
    const exact = (m.percent / shareTotal) * batchSize;
    return { ...m, exact, group: additionGroup(m, batchSize, options) };
  });

  const amounts = new Map<string, { amount: number; step: number }>();
  let minorSum = 0;
  for (const m of items.filter((i) => i.group === 'minor')) {
    const amount = onStep(Math.round(m.exact / minorStep), minorStep);
    amounts.set(m.id, { amount, step: minorStep });
    minorSum += amount;
  }
  // Largest remainder over the main-scale lines: floor each, then hand the steps still missing to the
  // largest fractional parts (ties to the larger amount, then by id, so the sheet is reproducible).
  const major = items.filter((i) => i.group !== 'minor');
  if (major.length) {
    const targetUnits = Math.max(0, Math.round((batchSize - minorSum) / macroStep));
    const scale = major.reduce((s, m) => s + m.exact, 0);
    const wanted = major.map((m) => ((m.exact / scale) * (batchSize - minorSum)) / macroStep);
    const units = wanted.map((w) => Math.floor(w + 1e-9));
    let missing = targetUnits - units.reduce((s, u) => s + u, 0);
    const byRemainder = wanted
      .map((w, k) => ({ k, r: w - units[k] }))
      .sort((a, b) => b.r - a.r || major[b.k].exact - major[a.k].exact || major[a.k].id.localeCompare(major[b.k].id));
    for (let i = 0; missing > 0 && byRemainder.length; i = (i + 1) % byRemainder.length, missing--) units[byRemainder[i].k] += 1;
    for (let i = byRemainder.length - 1; missing < 0; i = (i - 1 + byRemainder.length) % byRemainder.length) {
      if (units[byRemainder[i].k] > 0) {
        units[byRemainder[i].k] -= 1;
        missing++;
      }
    }
    major.forEach((m, k) => amounts.set(m.id, { amount: onStep(units[k], macroStep), step: macroStep }));
  }

  const ordered = GROUP_ORDER.flatMap((g) => items.filter((i) => i.group === g).sort((a, b) => b.exact - a.exact || a.name.localeCompare(b.name)));
  const lines: SheetLine[] = ordered.map((m, k) => {
    const { amount, step } = amounts.get(m.id)!;
    return {
      id: m.id,
      name: m.name,
      category: m.category,
      group: m.group,
      order: k + 1,
      percent: m.percent,
      exact: m.exact,
      amount,
      step,
      decimals: stepDecimals(step),
      callOut: callOut(m.category, m.group, m.percent),
    };
  });
  const allDecimals = Math.max(stepDecimals(macroStep), stepDecimals(minorStep));
  const total = Number(lines.reduce((s, l) => s + l.amount, 0).toFixed(allDecimals));
  return { batchSize, lines, total, difference: Number((total - batchSize).toFixed(Math.max(allDecimals, stepDecimals(batchSize)))), macroStep, minorStep };
}

function callOut(category: IngredientCategory, group: AdditionGroup, percent: number): string | null {
  if (category === 'premix') return 'Premix: weigh on the small scale and pre-blend with a little of the grain before it goes in.';
  if (category === 'synthetic_amino_acid') return 'Micro-ingredient: weigh on the small scale; check the label before adding.';
  if (group === 'minor' && percent < 1) return 'Micro-ingredient: weigh on the small scale.';
  if (group === 'minor') return 'Weigh on the small scale.';
  return null;
}
