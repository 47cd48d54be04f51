/**
 * Generated formulation problems for the cross-check suite and the benchmarks.
 *
 * Composition values are typical as-fed figures (common practice, recalled from
 * memory, not a cited table); they only need to make realistic, well-posed LPs.
 * The insect-meal row for defatted black soldier fly meal follows the values listed
 * for a commercial defatted meal in the project's domain notes. Prices are invented.
 */
import type { AllocationProblem, FormulaProblem, Ingredient } from '../../../src/shared/schemas/formulation';

/** Seeded generator (Park–Miller), so every generated suite is reproducible. */
export function rng(seed: number): () => number {
  let s = seed % 2147483647;
  if (s <= 0) s += 2147483646;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

const NUTRIENTS = ['amen', 'cp', 'lys', 'met', 'metcys', 'thr', 'trp', 'ca', 'avp', 'na', 'cl', 'fat', 'fibre', 'linoleic'] as const;

// amen kcal/kg; the rest % as fed; last column price per kg.
const BASE: [string, ...number[]][] = [
  ['corn', 3350, 8.5, 0.26, 0.18, 0.36, 0.29, 0.06, 0.02, 0.08, 0.02, 0.05, 3.8, 2.2, 1.9, 0.25],
  ['wheat', 3100, 13, 0.35, 0.2, 0.48, 0.37, 0.15, 0.05, 0.13, 0.01, 0.06, 1.7, 2.5, 0.6, 0.24],
  ['barley', 2640, 11, 0.4, 0.18, 0.42, 0.36, 0.13, 0.05, 0.15, 0.02, 0.15, 1.8, 5, 0.8, 0.21],
  ['sorghum', 3250, 9.5, 0.22, 0.16, 0.33, 0.31, 0.1, 0.03, 0.08, 0.01, 0.09, 2.9, 2.3, 1.1, 0.22],
  ['sbm44', 2230, 44, 2.7, 0.6, 1.28, 1.7, 0.6, 0.3, 0.25, 0.02, 0.05, 1, 7, 0.4, 0.42],
  ['sbm48', 2440, 48, 2.95, 0.66, 1.38, 1.85, 0.65, 0.3, 0.25, 0.02, 0.05, 1, 3.5, 0.4, 0.46],
  ['ffsoy', 3300, 37, 2.3, 0.52, 1.1, 1.45, 0.5, 0.25, 0.2, 0.03, 0.03, 19, 5, 9.5, 0.55],
  ['canola', 2000, 37, 2, 0.7, 1.55, 1.55, 0.45, 0.65, 0.3, 0.05, 0.05, 3.5, 11.5, 0.6, 0.3],
  ['ddgs', 2800, 27, 0.75, 0.5, 1, 0.95, 0.2, 0.05, 0.5, 0.2, 0.2, 9.5, 7, 4.5, 0.23],
  ['wheatbran', 1500, 15.5, 0.6, 0.22, 0.55, 0.48, 0.25, 0.13, 0.3, 0.05, 0.07, 4, 10, 1.7, 0.17],
  ['sunflower', 1800, 33, 1.15, 0.75, 1.3, 1.2, 0.4, 0.35, 0.25, 0.05, 0.1, 2, 20, 1, 0.28],
  ['peas', 2500, 22, 1.55, 0.2, 0.5, 0.8, 0.19, 0.1, 0.15, 0.04, 0.05, 1.2, 5.5, 0.5, 0.29],
  ['fishmeal', 2900, 64, 4.8, 1.75, 2.35, 2.6, 0.7, 5, 2.8, 0.5, 0.55, 9, 1, 0.2, 1.4],
  ['mbm', 2300, 50, 2.5, 0.7, 1.2, 1.6, 0.3, 9.5, 4, 0.7, 0.7, 9.5, 2.5, 0.4, 0.6],
  ['bsf-defatted', 2626, 58.5, 3.04, 0.82, 1.31, 2.03, 0.8, 1.9, 0.96, 0.12, 0.38, 6, 12, 1, 1.2],
  ['bsf-fullfat', 3500, 42, 2.4, 0.65, 1.05, 1.6, 0.6, 4, 0.8, 0.15, 0.3, 30, 9, 3, 1.0],
  ['mealworm', 4500, 50, 2.6, 0.7, 1.15, 2, 0.5, 0.1, 0.6, 0.1, 0.2, 30, 6, 7, 1.6],
  ['housefly', 3100, 56, 3.6, 1.3, 1.7, 2.1, 0.8, 0.5, 0.9, 0.3, 0.3, 14, 8, 3, 1.3],
  ['soyoil', 8800, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 99, 0, 52, 0.95],
  ['tallow', 7800, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 99, 0, 3, 0.7],
  ['limestone', 0, 0, 0, 0, 0, 0, 0, 38, 0, 0, 0, 0, 0, 0, 0.05],
  ['dcp', 0, 0, 0, 0, 0, 0, 0, 23, 18, 0, 0, 0, 0, 0, 0.55],
  ['mcp', 0, 0, 0, 0, 0, 0, 0, 16, 21, 0, 0, 0, 0, 0, 0.6],
  ['salt', 0, 0, 0, 0, 0, 0, 0, 0, 0, 39.3, 60.7, 0, 0, 0, 0.1],
  ['bicarb', 0, 0, 0, 0, 0, 0, 0, 0, 0, 27.4, 0, 0, 0, 0, 0.35],
  ['lys-hcl', 4100, 95.9, 78.8, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1.6],
  ['dl-met', 5000, 58.7, 0, 99, 99, 0, 0, 0, 0, 0, 0, 0, 0, 0, 2.8],
  ['l-thr', 3600, 73.5, 0, 0, 0, 98.5, 0, 0, 0, 0, 0, 0, 0, 0, 1.9],
];
const VARIANTS = ['corn', 'wheat', 'sbm44', 'sbm48', 'canola', 'ddgs', 'fishmeal', 'bsf-defatted', 'soyoil', 'limestone', 'dcp', 'barley'];

export const INSECTS = ['bsf-defatted', 'bsf-fullfat', 'mealworm', 'housefly', 'bsf-defatted-b'];
const ANIMAL = ['fishmeal', 'mbm', 'fishmeal-b'];
const FATS = ['soyoil', 'tallow', 'soyoil-b'];
const CEREALS = ['corn', 'wheat', 'barley', 'sorghum', 'corn-b', 'wheat-b', 'barley-b'];
const SYNTHETIC = ['lys-hcl', 'dl-met', 'l-thr'];

/** The 40-ingredient library: 28 base rows and 12 second-supplier variants. */
export function library(r: () => number = rng(7), jitter = 0.05): Ingredient[] {
  const out: Ingredient[] = [];
  const make = (row: [string, ...number[]], id: string, j: number) => {
    const nutrients: Record<string, number> = {};
    NUTRIENTS.forEach((n, k) => {
      const v = row[k + 1] as number;
      if (v !== 0) nutrients[n] = v * (1 + j * (2 * r() - 1));
    });
    out.push({ id, pricePerKg: (row[15] as number) * (1 + 4 * j * (2 * r() - 1)), nutrients });
  };
  for (const row of BASE) make(row, row[0], jitter);
  for (const v of VARIANTS) make(BASE.find((b) => b[0] === v) as [string, ...number[]], `${v}-b`, jitter * 1.5);
  return out;
}

/** Broiler grower specification: 22 nutrient bound sides, 6 ratio sides, 5 groups (common practice values). */
export function broilerSpec(r: () => number, jitter = 0.03) {
  const f = () => 1 + jitter * (2 * r() - 1);
  const nutrients: FormulaProblem['nutrients'] = [
    { id: 'amen', unit: 'kcal/kg', min: 3000 * f(), max: 3250 * f() },
    { id: 'cp', name: 'crude protein', unit: '%', min: 20 * f(), max: 23.5 * f() },
    { id: 'lys', name: 'digestible lysine', unit: '%', min: 1.05 * f(), max: 1.4 },
    { id: 'met', unit: '%', min: 0.45 * f() },
    { id: 'metcys', unit: '%', min: 0.8 * f(), max: 1.1 },
    { id: 'thr', unit: '%', min: 0.7 * f(), max: 1.0 },
    { id: 'trp', unit: '%', min: 0.18 * f() },
    { id: 'ca', unit: '%', min: 0.85 * f(), max: 1.0 * f() },
    { id: 'avp', unit: '%', min: 0.42 * f(), max: 0.5 * f() },
    { id: 'na', unit: '%', min: 0.16 * f(), max: 0.23 },
    { id: 'cl', unit: '%', min: 0.16 * f(), max: 0.3 },
    { id: 'fat', name: 'crude fat', unit: '%', max: 7 * f() },
    { id: 'fibre', name: 'crude fibre', unit: '%', max: 5 * f() },
    { id: 'linoleic', unit: '%', min: 1.0 * f() },
  ];
  const ratios: FormulaProblem['ratios'] = [
    { id: 'ca:avp', numerator: 'ca', denominator: 'avp', min: 1.8, max: 2.2 },
    { id: 'metcys:lys', numerator: 'metcys', denominator: 'lys', min: 0.74 * f() },
    { id: 'thr:lys', numerator: 'thr', denominator: 'lys', min: 0.63 * f(), max: 0.75 },
    { id: 'trp:lys', numerator: 'trp', denominator: 'lys', min: 0.16 },
  ];
  return { nutrients, ratios };
}

/**
 * A 40-ingredient, 40-bound broiler ration for a 1,000 kg batch (14 nutrients with
 * 22 bound sides, 4 ratios with 6 sides, 5 groups, 7 inclusion caps).
 */
export function broilerProblem(seed = 1, opts: { ingredients?: number; jitter?: number } = {}): FormulaProblem {
  const r = rng(seed);
  let ings = library(r, opts.jitter ?? 0.05);
  if (opts.ingredients !== undefined && opts.ingredients < ings.length) {
    // Keep the essentials (a cereal, a protein, minerals, salt) and sample the rest.
    const keep = new Set(['corn', 'sbm48', 'limestone', 'dcp', 'salt', 'soyoil', 'lys-hcl', 'dl-met', 'l-thr', 'bicarb']);
    const rest = ings.filter((i) => !keep.has(i.id)).sort(() => r() - 0.5);
    ings = [...ings.filter((i) => keep.has(i.id)), ...rest.slice(0, Math.max(0, opts.ingredients - keep.size))];
  }
  const ids = new Set(ings.map((i) => i.id));
  const caps: Record<string, number> = { wheatbran: 50, ddgs: 80, canola: 100, sunflower: 60, salt: 5, mbm: 40, peas: 150 };
  for (const ing of ings) {
    const cap = caps[ing.id.replace(/-b$/, '')];
    if (cap !== undefined) ing.maxKg = cap * (1 + 0.1 * (2 * r() - 1));
  }
  const spec = broilerSpec(r);
  const g = (id: string, members: string[], b: { minKg?: number; maxKg?: number }) => {
    const m = members.filter((x) => ids.has(x));
    return m.length ? [{ id, members: m, ...b }] : [];
  };
  return {
    name: `broiler grower ${seed}`,
    batchKg: 1000,
    ingredients: ings,
    nutrients: spec.nutrients,
    ratios: spec.ratios,
    groups: [
      ...g('insect', INSECTS, { maxKg: 120 }),
      ...g('animal', ANIMAL, { maxKg: 80 }),
      ...g('fat', FATS, { maxKg: 50 }),
      ...g('cereal', CEREALS, { minKg: 400 }),
      ...g('synthetic', SYNTHETIC, { maxKg: 10 }),
    ],
  };
}

/** Variants for the cross-check suite. */
export type Variant = 'feasible' | 'infeasible' | 'degenerate' | 'fixed' | 'small';

/** Problem number `i` of the cross-check suite, cycling through the variants. */
export function suiteProblem(i: number): { variant: Variant; problem: FormulaProblem } {
  const variants: Variant[] = ['feasible', 'feasible', 'infeasible', 'degenerate', 'fixed', 'small'];
  const variant = variants[i % variants.length];
  const r = rng(1000 + i);
  const size = 12 + Math.floor(r() * 29);
  const p = broilerProblem(2000 + i, { ingredients: variant === 'small' ? 6 + Math.floor(r() * 6) : size });
  if (variant === 'small') {
    // Few ingredients: keep only the easy bounds so most stay feasible.
    p.nutrients = p.nutrients.filter((n) => ['cp', 'ca', 'fibre', 'na'].includes(n.id)).map((n) => ({ ...n, max: n.id === 'cp' ? undefined : n.max }));
    p.ratios = [];
    p.groups = p.groups.filter((g) => g.id !== 'cereal');
  }
  if (variant === 'infeasible') {
    const k = i % 4;
    if (k === 0) Object.assign(p.nutrients.find((n) => n.id === 'cp')!, { min: 30 + 5 * r(), max: undefined });
    else if (k === 1) p.nutrients.find((n) => n.id === 'fibre')!.max = 0.3;
    else if (k === 2) p.groups.push({ id: 'minerals', members: ['limestone', 'dcp', 'salt'], minKg: 300 });
    else p.ratios.push({ id: 'hi-ca', numerator: 'ca', denominator: 'cp', min: 0.5 });
  }
  if (variant === 'degenerate') {
    // A twin ingredient (alternative optima) and a calcium band closed to one value.
    const twin = { ...p.ingredients[0], id: `${p.ingredients[0].id}-twin`, nutrients: { ...p.ingredients[0].nutrients } };
    p.ingredients.push(twin);
    const ca = p.nutrients.find((n) => n.id === 'ca')!;
    ca.min = ca.max = 0.9;
  }
  if (variant === 'fixed') {
    const ing = p.ingredients.find((x) => x.id === 'corn')!;
    ing.fixedKg = 450 + 100 * r();
    delete ing.maxKg;
    const bsf = p.ingredients.find((x) => x.id.startsWith('bsf'));
    if (bsf) bsf.minKg = 20;
  }
  return { variant, problem: p };
}

/**
 * An allocation of `formulas` formulas (25 ingredients each, drawn from the 40-ingredient
 * library) with tonnages of 5–50 t and shared stocks on the insect meals and fish meal
 * that are tight enough to bind.
 */
export function allocationProblem(formulas: number, seed = 1): AllocationProblem {
  const r = rng(seed);
  // Insect meals priced to compete with soybean meal, so the stocks matter.
  const lib = library(r, 0.05).map((i) => (INSECTS.includes(i.id) || i.id === 'fishmeal' ? { ...i, pricePerKg: 0.35 + 0.15 * r() } : i));
  const stocks: Record<string, number> = { 'bsf-defatted': 0, 'bsf-fullfat': 0, mealworm: 0, housefly: 0, fishmeal: 0 };
  const forms: AllocationProblem['formulas'] = [];
  let totalKg = 0;
  for (let f = 0; f < formulas; f++) {
    const p = broilerProblem(seed * 1000 + f, { ingredients: 25, jitter: 0 });
    const batchKg = 5000 + Math.round(45000 * r());
    totalKg += batchKg;
    const scale = batchKg / 1000;
    forms.push({
      id: `f${f + 1}`,
      batchKg,
      ingredients: p.ingredients.map((i) => ({ id: i.id, ...(i.maxKg !== undefined ? { maxKg: i.maxKg * scale } : {}) })),
      nutrients: p.nutrients,
      ratios: p.ratios,
      groups: p.groups.map((g) => ({ ...g, ...(g.minKg !== undefined ? { minKg: g.minKg * scale } : {}), ...(g.maxKg !== undefined ? { maxKg: g.maxKg * scale } : {}) })),
    });
  }
  // Stocks: a few percent of the total tonnage, so the cheap protein sources run short.
  for (const id of Object.keys(stocks)) stocks[id] = Math.round(totalKg * (0.005 + 0.02 * r()));
  return {
    ingredients: lib.map((i) => (stocks[i.id] !== undefined ? { ...i, stockKg: stocks[i.id] } : i)),
    formulas: forms,
  };
}
